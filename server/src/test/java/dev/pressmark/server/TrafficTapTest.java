package dev.pressmark.server;

import static org.assertj.core.api.Assertions.assertThat;

import dev.pressmark.core.bundle.Bundle;
import dev.pressmark.core.bundle.Prediction;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.concurrent.CountDownLatch;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicInteger;
import org.junit.jupiter.api.Test;

class TrafficTapTest {

    private static final List<Map<String, String>> ONE_ITEM = List.of(Map.of("title", "x"));

    @Test
    void with_nothing_listening_nothing_is_wanted_or_queued() {
        try (Metrics metrics = new Metrics(); TrafficTap tap = new TrafficTap(4, metrics)) {
            assertThat(tap.wants("routing")).isFalse();
            assertThat(tap.offer("routing", "1", null, ONE_ITEM, List.of())).isTrue();
            assertThat(tap.dropped()).isZero();
            assertThat(tap.idle()).isTrue();
        }
    }

    @Test
    void a_listener_that_runs_out_of_memory_fails_that_delivery_and_the_worker_goes_on() throws Exception {
        AtomicInteger calls = new AtomicInteger();
        CountDownLatch second = new CountDownLatch(1);
        try (Metrics metrics = new Metrics(); TrafficTap tap = new TrafficTap(4, metrics)) {
            tap.register((model, tag, served, items, results) -> {
                if (calls.incrementAndGet() == 1) {
                    throw new OutOfMemoryError("Java heap space");
                }
                second.countDown();
            });
            assertThat(tap.offer("routing", "1", null, ONE_ITEM, List.of())).isTrue();
            assertThat(tap.offer("routing", "1", null, ONE_ITEM, List.of())).isTrue();
            assertThat(second.await(10, TimeUnit.SECONDS)).as("the second request delivered after the first failed").isTrue();
            assertThat(metrics.scrape()).contains("pressmark_tap_listener_failures_total{kind=\"OutOfMemoryError\"} 1.0");
        }
    }

    @Test
    void a_stuck_listener_never_blocks_an_offer_and_exactly_the_overflow_is_dropped_and_counted() throws Exception {
        CountDownLatch entered = new CountDownLatch(1);
        CountDownLatch release = new CountDownLatch(1);
        AtomicInteger delivered = new AtomicInteger();
        AtomicInteger droppedItems = new AtomicInteger();
        int capacity = 3;
        try (Metrics metrics = new Metrics(); TrafficTap tap = new TrafficTap(capacity, metrics)) {
            tap.register(new TrafficTap.Listener() {
                @Override
                public void onPredict(String model, String tag, Bundle served, List<Map<String, String>> items, List<Prediction> results) {
                    entered.countDown();
                    try {
                        release.await(30, TimeUnit.SECONDS);
                    } catch (InterruptedException e) {
                        Thread.currentThread().interrupt();
                    }
                    delivered.incrementAndGet();
                }

                @Override
                public void onDropped(String model, int items) {
                    droppedItems.addAndGet(items);
                }
            });
            assertThat(tap.wants("routing")).isTrue();
            assertThat(tap.offer("routing", "1", null, ONE_ITEM, List.of())).isTrue();
            assertThat(entered.await(10, TimeUnit.SECONDS)).isTrue();
            // the worker holds the first; the queue takes `capacity` more; the other 6 are dropped at once
            List<Boolean> answers = new ArrayList<>();
            for (int i = 0; i < capacity + 6; i++) {
                answers.add(tap.offer("routing", "1", null, List.of(Map.of("a", "1"), Map.of("a", "2")), List.of()));
            }
            assertThat(answers.subList(0, capacity)).containsOnly(true);
            assertThat(answers.subList(capacity, answers.size())).containsOnly(false);
            assertThat(tap.dropped()).isEqualTo(6);
            assertThat(droppedItems.get()).isEqualTo(12);
            assertThat(Scrape.of(metrics.scrape()).counter("pressmark_tap_dropped_total", Map.of("model", "routing"))).isEqualTo(6.0);
            release.countDown();
            tap.drain(10_000);
            assertThat(tap.idle()).isTrue();
            assertThat(delivered.get()).isEqualTo(1 + capacity);
        }
    }

    @Test
    void a_failing_listener_is_counted_and_the_next_listener_still_gets_every_request() {
        AtomicInteger seen = new AtomicInteger();
        try (Metrics metrics = new Metrics(); TrafficTap tap = new TrafficTap(100, metrics)) {
            tap.register((model, tag, served, items, results) -> {
                throw new IllegalStateException("listener bug");
            });
            tap.register((model, tag, served, items, results) -> seen.incrementAndGet());
            for (int i = 0; i < 10; i++) {
                assertThat(tap.offer("routing", "1", null, ONE_ITEM, List.of())).isTrue();
            }
            tap.drain(10_000);
            assertThat(seen.get()).isEqualTo(10);
            assertThat(Scrape.of(metrics.scrape()).counter("pressmark_tap_listener_failures_total", Map.of("kind", "IllegalStateException")))
                    .isEqualTo(10.0);
        }
    }

    @Test
    void a_listener_that_does_not_want_a_model_gets_none_of_its_requests() {
        AtomicInteger seen = new AtomicInteger();
        try (Metrics metrics = new Metrics(); TrafficTap tap = new TrafficTap(100, metrics)) {
            tap.register(new TrafficTap.Listener() {
                @Override
                public void onPredict(String model, String tag, Bundle served, List<Map<String, String>> items, List<Prediction> results) {
                    seen.incrementAndGet();
                }

                @Override
                public boolean wants(String model) {
                    return model.equals("other");
                }
            });
            assertThat(tap.wants("routing")).isFalse();
            tap.offer("routing", "1", null, ONE_ITEM, List.of());
            tap.offer("other", "1", null, ONE_ITEM, List.of());
            tap.drain(10_000);
            assertThat(seen.get()).isEqualTo(1);
        }
    }
}
