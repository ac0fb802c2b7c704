package dev.pressmark.server;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.databind.JsonNode;
import dev.pressmark.core.bundle.Bundle;
import dev.pressmark.store.BundleStore;
import dev.pressmark.store.jdbc.JdbcStores;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.SplittableRandom;
import java.util.concurrent.ConcurrentHashMap;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicInteger;
import java.util.concurrent.atomic.AtomicLong;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Activations made elsewhere, here through a second store handle on the same SQLite file as the
 * command line would, reach the server through the change feed; swaps drop no request.
 */
class HotSwapTest {

    /** What the service promises: every replica serves a new activation within 2 s. */
    private static final Duration PICKED_UP_WITHIN = Duration.ofSeconds(2);
    private static final String TITLE = "voltamp outlet pro";
    private static final String ONE_ITEM = "{\"items\":[{\"title\":\"" + TITLE + "\"}]}";

    private static final byte[] first = TestBundles.svm();
    private static final byte[] second = TestBundles.logistic();

    @TempDir
    Path dir;

    /** Polls until the server serves {@code tag}; returns how long that took. */
    private static Duration awaitServed(Served s, String tag, Duration limit) throws InterruptedException {
        long start = System.nanoTime();
        long deadline = start + limit.toNanos() * 3;
        while (System.nanoTime() < deadline) {
            if (s.servedVersion().equals(tag)) {
                return Duration.ofNanos(System.nanoTime() - start);
            }
            Thread.sleep(20);
        }
        throw new AssertionError(tag + " was not served within " + limit.multipliedBy(3));
    }

    @Test
    void an_activation_through_another_store_handle_is_served_within_two_seconds() throws Exception {
        try (Served s = Served.on(dir); BundleStore cli = JdbcStores.open(s.storeUrl)) {
            cli.publish("routing", "1.0.0", first, "cli");
            cli.activate("routing", "1.0.0", "cli", "first");
            assertThat(awaitServed(s, "1.0.0", PICKED_UP_WITHIN)).isLessThan(PICKED_UP_WITHIN);

            cli.publish("routing", "1.1.0", second, "cli");
            cli.activate("routing", "1.1.0", "cli", "second");
            assertThat(awaitServed(s, "1.1.0", PICKED_UP_WITHIN)).isLessThan(PICKED_UP_WITHIN);

            cli.rollback("routing", "cli");
            assertThat(awaitServed(s, "1.0.0", PICKED_UP_WITHIN)).isLessThan(PICKED_UP_WITHIN);
        }
    }

    @Test
    void a_version_that_fails_to_load_leaves_the_old_one_serving_and_shows_in_readiness() throws Exception {
        try (Served s = Served.on(dir); BundleStore cli = JdbcStores.open(s.storeUrl)) {
            cli.publish("routing", "1.0.0", first, "cli");
            cli.activate("routing", "1.0.0", "cli", "first");
            awaitServed(s, "1.0.0", PICKED_UP_WITHIN);
            assertThat(s.http.get("/health/ready").status()).isEqualTo(200);

            // a version this program would refuse to publish, stored and activated as an older program could
            TestBundles.storeUnchecked(s.storeUrl, "routing", "2.0.0", TestBundles.unloadable());
            cli.activate("routing", "2.0.0", "cli", "broken build");
            JsonNode ready = null;
            long deadline = System.nanoTime() + PICKED_UP_WITHIN.toNanos() * 3;
            while (System.nanoTime() < deadline) {
                Http.Answer answer = s.http.get("/health/ready");
                if (answer.status() == 503 && answer.json().at("/models/routing").has("failed_tag")) {
                    ready = answer.json();
                    break;
                }
                Thread.sleep(20);
            }
            assertThat(ready).as("readiness turned 503 and names the failure").isNotNull();
            assertThat(ready.at("/models/routing/active").asText()).isEqualTo("2.0.0");
            assertThat(ready.get("status").asText()).isEqualTo("not-ready");
            assertThat(ready.at("/models/routing/serving").asText()).isEqualTo("1.0.0");
            assertThat(ready.at("/models/routing/failed_tag").asText()).isEqualTo("2.0.0");
            assertThat(ready.at("/models/routing/error").asText()).isNotBlank();
            assertThat(s.servedVersion()).isEqualTo("1.0.0");

            cli.activate("routing", "1.0.0", "cli", "back to the good one");
            deadline = System.nanoTime() + PICKED_UP_WITHIN.toNanos() * 3;
            while (System.nanoTime() < deadline && s.http.get("/health/ready").status() != 200) {
                Thread.sleep(20);
            }
            assertThat(s.http.get("/health/ready").status()).isEqualTo(200);
        }
    }

    @Test
    @Tag("slow") // soak-like: 10.5 s of flips
    void clients_predicting_while_the_active_version_flips_every_200_ms_see_no_failure() throws Exception {
        // four clients per core and about 50 activations, so that requests are in flight whenever a swap lands
        int clients = 8;
        long runNanos = Duration.ofMillis(10_500).toNanos();
        try (Served s = Served.on(dir); BundleStore cli = JdbcStores.open(s.storeUrl)) {
            cli.publish("routing", "1.0.0", first, "cli");
            cli.publish("routing", "1.1.0", second, "cli");
            cli.activate("routing", "1.0.0", "cli", "first");
            awaitServed(s, "1.0.0", PICKED_UP_WITHIN);

            // the version a response names must be the one that computed it: each version's own score for the item
            Map<String, Double> scoreOf = Map.of(
                    "1.0.0", Bundle.read(first).predict(Map.of("title", TITLE)).score(),
                    "1.1.0", Bundle.read(second).predict(Map.of("title", TITLE)).score());
            assertThat(scoreOf.get("1.0.0")).isNotEqualTo(scoreOf.get("1.1.0"));
            Set<String> seen = ConcurrentHashMap.newKeySet();
            AtomicInteger failures = new AtomicInteger();
            AtomicLong requests = new AtomicLong();
            AtomicInteger swapsSeen = new AtomicInteger();
            List<String> firstFailures = new ArrayList<>();
            long end = System.nanoTime() + runNanos;
            ExecutorService pool = Executors.newFixedThreadPool(clients);
            List<Future<?>> running = new ArrayList<>();
            for (int c = 0; c < clients; c++) {
                running.add(pool.submit(() -> {
                    Http http = new Http(s.server.port());
                    String previous = null;
                    int changes = 0;
                    while (System.nanoTime() < end) {
                        try {
                            Http.Answer answer = http.postJson("/models/routing/predict", ONE_ITEM);
                            requests.incrementAndGet();
                            Double expected = answer.status() == 200 ? scoreOf.get(answer.json().get("version").asText()) : null;
                            if (expected == null || answer.json().at("/results/0/score").asDouble() != expected) {
                                fail(failures, firstFailures, answer.status() + " " + answer.body());
                            } else {
                                String version = answer.json().get("version").asText();
                                seen.add(version);
                                if (previous != null && !previous.equals(version)) {
                                    changes++;
                                }
                                previous = version;
                            }
                        } catch (RuntimeException e) {
                            fail(failures, firstFailures, e.toString());
                        }
                    }
                    swapsSeen.accumulateAndGet(changes, Math::max);
                }));
            }
            // The follower polls the SQLite feed every 500 ms; flips at exactly 200 ms plus the activation's own time can
            // fall into step with that poll and show it the same version round after round, so each pause is 150-250 ms.
            SplittableRandom jitter = new SplittableRandom(11);
            int flips = 0;
            while (System.nanoTime() < end) {
                Thread.sleep(150 + jitter.nextInt(101));
                cli.activate("routing", flips % 2 == 0 ? "1.1.0" : "1.0.0", "cli", "flip " + flips);
                flips++;
            }
            for (Future<?> f : running) {
                f.get(30, TimeUnit.SECONDS);
            }
            pool.shutdown();
            assertThat(pool.awaitTermination(10, TimeUnit.SECONDS)).isTrue();

            assertThat(failures.get()).as("failed requests, first ones: %s", firstFailures).isZero();
            assertThat(requests.get()).isGreaterThan(clients);
            assertThat(flips).isGreaterThanOrEqualTo(30);
            // a run in which the served version never changed under a client would prove nothing about swaps
            assertThat(swapsSeen.get()).as("swaps one client saw").isGreaterThanOrEqualTo(3);
            assertThat(seen).containsExactlyInAnyOrder("1.0.0", "1.1.0");
        }
    }

    private static void fail(AtomicInteger failures, List<String> firstFailures, String what) {
        failures.incrementAndGet();
        synchronized (firstFailures) {
            if (firstFailures.size() < 5) {
                firstFailures.add(what);
            }
        }
    }
}
