package dev.pressmark.server;

import static org.assertj.core.api.Assertions.assertThat;

import java.nio.file.Path;
import java.time.Duration;
import java.util.concurrent.CountDownLatch;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicInteger;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** Background loops that fail, an OutOfMemoryError included, are run again, counted, and shown by readiness until they recover. */
class SupervisorTest {

    @TempDir
    Path dir;

    @Test
    void a_loop_that_runs_out_of_memory_is_run_again_counted_and_down_until_it_has_run_a_while() throws Exception {
        AtomicInteger runs = new AtomicInteger();
        CountDownLatch third = new CountDownLatch(1);
        CountDownLatch stop = new CountDownLatch(1);
        try (Metrics metrics = new Metrics()) {
            Supervisor supervisor = new Supervisor(metrics, 500);
            Thread thread = supervisor.thread("pressmark-test-loop", () -> {
                if (runs.incrementAndGet() <= 2) {
                    throw new OutOfMemoryError("Java heap space");
                }
                third.countDown();
                try {
                    stop.await();
                } catch (InterruptedException e) {
                    Thread.currentThread().interrupt();
                }
            });
            thread.start();
            assertThat(third.await(10, TimeUnit.SECONDS)).as("the loop's third run").isTrue();
            assertThat(supervisor.down()).containsOnlyKeys("pressmark-test-loop");
            assertThat(supervisor.down().get("pressmark-test-loop")).contains("OutOfMemoryError", "Java heap space", "restarted 2 times");
            assertThat(metrics.scrape()).contains("pressmark_background_restarts_total{thread=\"pressmark-test-loop\"} 2.0");
            long deadline = System.nanoTime() + Duration.ofSeconds(10).toNanos();
            while (!supervisor.down().isEmpty() && System.nanoTime() < deadline) {
                Thread.sleep(50);
            }
            assertThat(supervisor.down()).as("up again after running 500 ms without failing").isEmpty();
            stop.countDown();
            thread.join(5_000);
            assertThat(thread.isAlive()).as("a loop that returns is not run again").isFalse();
            assertThat(runs.get()).isEqualTo(3);
        }
    }

    @Test
    void readiness_is_503_naming_a_background_loop_while_it_keeps_failing() throws Exception {
        try (Served s = Served.on(dir)) {
            assertThat(s.http.get("/health/ready").status()).isEqualTo(200);
            Thread failing = s.server.supervisor().thread("pressmark-test-failing", () -> {
                throw new OutOfMemoryError("Java heap space");
            });
            failing.start();
            long deadline = System.nanoTime() + Duration.ofSeconds(10).toNanos();
            Http.Answer ready = s.http.get("/health/ready", Served.AS_ADMIN);
            while (ready.status() == 200 && System.nanoTime() < deadline) {
                Thread.sleep(20);
                ready = s.http.get("/health/ready", Served.AS_ADMIN);
            }
            failing.interrupt();
            assertThat(ready.status()).isEqualTo(503);
            assertThat(ready.json().path("status").asText()).isEqualTo("not-ready");
            assertThat(ready.json().path("background").path("pressmark-test-failing").asText()).contains("OutOfMemoryError");
            assertThat(s.http.get("/metrics", Served.AS_ADMIN).body()).contains("pressmark_background_restarts_total{thread=\"pressmark-test-failing\"}");
        }
    }
}
