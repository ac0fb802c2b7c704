package dev.pressmark.server;

import static org.assertj.core.api.Assertions.assertThat;

import java.util.List;
import java.util.Map;
import java.util.concurrent.CopyOnWriteArrayList;
import java.util.concurrent.CountDownLatch;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Test;

class TrafficTapTest {

    @Test
    void a_full_queue_drops_and_counts_instead_of_waiting_and_a_failing_listener_stops_no_one() throws InterruptedException {
        try (Metrics metrics = new Metrics(); TrafficTap tap = new TrafficTap(1, metrics)) {
            CountDownLatch taken = new CountDownLatch(1);
            CountDownLatch release = new CountDownLatch(1);
            CountDownLatch done = new CountDownLatch(2);
            List<String> seen = new CopyOnWriteArrayList<>();
            tap.register((model, tag, served, items, results) -> {
                throw new IllegalStateException("this listener always fails");
            });
            tap.register((model, tag, served, items, results) -> {
                taken.countDown();
                try {
                    release.await(10, TimeUnit.SECONDS);
                } catch (InterruptedException e) {
                    Thread.currentThread().interrupt();
                }
                seen.add(tag);
                done.countDown();
            });
            assertThat(tap.offer("routing", "1", null, List.of(Map.of("title", "a")), List.of())).isTrue();
            assertThat(taken.await(10, TimeUnit.SECONDS)).isTrue();
            // The worker holds the first request; the queue has room for one more, and the third is dropped at once.
            assertThat(tap.offer("routing", "2", null, List.of(), List.of())).isTrue();
            assertThat(tap.offer("routing", "3", null, List.of(), List.of())).isFalse();
            assertThat(tap.dropped()).isEqualTo(1);
            assertThat(Scrape.of(metrics.scrape()).counter("pressmark_traffic_tap_dropped_total", Map.of())).isEqualTo(1.0);
            release.countDown();
            assertThat(done.await(10, TimeUnit.SECONDS)).isTrue();
            assertThat(seen).containsExactly("1", "2");
        }
    }
}
