package dev.pressmark.server;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.core.type.TypeReference;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import dev.pressmark.core.bundle.Bundle;
import dev.pressmark.core.bundle.Prediction;
import dev.pressmark.store.StoreEvent;
import dev.pressmark.store.jdbc.JdbcStores;
import java.nio.file.Path;
import java.time.Duration;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.SplittableRandom;
import java.util.TreeMap;
import java.util.concurrent.CountDownLatch;
import java.util.concurrent.TimeUnit;
import java.util.function.Predicate;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** Shadow scoring on a real server over a real SQLite store: what it counts, checked against the service's own named-version answers. */
class ShadowScoringTest {

    private static final ObjectMapper JSON = new ObjectMapper();
    private static final String[] WORDS = {"aqua", "flow", "valve", "pipe", "drain", "volt", "amp", "switch", "outlet", "breaker", "fern", "leaf",
        "hose", "rake", "planter", "pro", "kit", "pack", "steel", "black"};

    private static final byte[] first = TestBundles.svm();
    private static final byte[] second = TestBundles.logistic();

    @TempDir
    Path dir;

    /** Titles of three random words: many of them mix departments, so the two versions disagree on some. */
    static String items(int count, long seed) {
        SplittableRandom random = new SplittableRandom(seed);
        ArrayNode items = JSON.createArrayNode();
        for (int i = 0; i < count; i++) {
            items.addObject().put("title", WORDS[random.nextInt(WORDS.length)] + WORDS[random.nextInt(WORDS.length)] + " "
                    + WORDS[random.nextInt(WORDS.length)] + " " + WORDS[random.nextInt(WORDS.length)]);
        }
        ObjectNode body = JSON.createObjectNode();
        body.set("items", items);
        return body.toString();
    }

    private static Served servingTwo(Path dir, ServerConfig config) {
        return Served.on(dir, config).serving(first).publishing("1.1.0", second);
    }

    private static JsonNode awaitReport(Served s, Predicate<JsonNode> done, Duration limit) throws InterruptedException {
        long deadline = System.nanoTime() + limit.toNanos();
        JsonNode report = null;
        while (System.nanoTime() < deadline) {
            Http.Answer answer = s.http.get("/models/routing/shadow");
            assertThat(answer.status()).as(answer.body()).isEqualTo(200);
            report = answer.json();
            if (done.test(report)) {
                return report;
            }
            Thread.sleep(50);
        }
        throw new AssertionError("the shadow report did not get there within " + limit + "; last: " + report);
    }

    private static void awaitIdle(Served s) throws InterruptedException {
        long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(20);
        while (!s.server.tap().idle()) {
            assertThat(System.nanoTime()).as("the tap drained within 20 s").isLessThan(deadline);
            Thread.sleep(20);
        }
    }

    @Test
    void at_fraction_one_every_item_is_scored_and_the_agreement_is_what_the_named_version_endpoint_gives() throws Exception {
        try (Served s = servingTwo(dir, Served.config())) {
            Http.Answer started = s.http.putJson("/models/routing/shadow", "{\"tag\":\"1.1.0\",\"fraction\":1.0}", Served.AS_ADMIN);
            assertThat(started.status()).as(started.body()).isEqualTo(200);
            assertThat(started.json().get("running").asBoolean()).isTrue();
            assertThat(started.json().get("fraction").asDouble()).isEqualTo(1.0);

            // The reference: the same items sent to each version's own endpoint, compared here.
            long agreeing = 0;
            long total = 0;
            Map<String, Map<String, Long>> table = new TreeMap<>();
            for (int r = 0; r < 20; r++) {
                String body = items(5, r);
                Http.Answer live = s.http.postJson("/models/routing/predict", body);
                Http.Answer candidate = s.http.postJson("/models/routing/versions/1.1.0/predict", body);
                assertThat(live.json().get("version").asText()).isEqualTo("1.0.0");
                for (int i = 0; i < 5; i++) {
                    String a = live.json().at("/results/" + i + "/label").asText();
                    String c = candidate.json().at("/results/" + i + "/label").asText();
                    agreeing += a.equals(c) ? 1 : 0;
                    total++;
                    table.computeIfAbsent(a, k -> new TreeMap<>()).merge(c, 1L, Long::sum);
                }
            }
            assertThat(agreeing).as("the two versions must disagree somewhere for the check to mean anything").isLessThan(total);
            JsonNode report = awaitReport(s, r -> r.get("samples").asLong() == 100, Duration.ofSeconds(20));
            assertThat(report.get("model").asText()).isEqualTo("routing");
            assertThat(report.get("active").asText()).isEqualTo("1.0.0");
            assertThat(report.get("candidate").asText()).isEqualTo("1.1.0");
            assertThat(report.get("dropped").asLong()).isZero();
            assertThat(report.get("agreeing").asLong()).isEqualTo(agreeing);
            assertThat(report.get("agreement").asDouble()).isEqualTo((double) agreeing / total);
            assertThat(JSON.convertValue(report.get("labels"), new TypeReference<Map<String, Map<String, Long>>>() { })).isEqualTo(table);
            assertThat(report.at("/score_difference/count").asLong()).isEqualTo(100);
            assertThat(report.at("/score_difference/basis").asText()).isEqualTo("probability");
            long binned = 0;
            for (JsonNode n : report.at("/score_difference/counts")) {
                binned += n.asLong();
            }
            assertThat(binned).isEqualTo(100);

            Http.Answer stopped = s.http.send(s.http.request("/models/routing/shadow", Served.AS_ADMIN).DELETE());
            assertThat(stopped.status()).as(stopped.body()).isEqualTo(200);
            assertThat(stopped.json().get("running").asBoolean()).isFalse();
            assertThat(stopped.json().get("samples").asLong()).isEqualTo(100);
            // the final snapshot is in the store, for the command line and the promotion check
            assertThat(s.store.shadowReports("routing", Optional.of("1.1.0"))).singleElement()
                    .satisfies(rep -> assertThat(rep.summary().samples()).isEqualTo(100));
            assertThat(s.store.events("routing")).extracting(StoreEvent::action).startsWith(StoreEvent.SHADOW_STOP, StoreEvent.SHADOW_START);
            assertThat(s.http.send(s.http.request("/models/routing/shadow", Served.AS_ADMIN).DELETE()).status()).isEqualTo(404);
        }
    }

    @Test
    void at_fraction_one_fifth_the_sampled_count_is_within_five_standard_deviations_of_the_binomial_mean() throws Exception {
        int requests = 400;
        double fraction = 0.2;
        try (Served s = servingTwo(dir, Served.config())) {
            assertThat(s.http.putJson("/models/routing/shadow", "{\"tag\":\"1.1.0\",\"fraction\":0.2}", Served.AS_ADMIN).status()).isEqualTo(200);
            String one = items(1, 99);
            for (int i = 0; i < requests; i++) {
                assertThat(s.http.postJson("/models/routing/predict", one).status()).isEqualTo(200);
            }
            awaitIdle(s);
            long samples = awaitReport(s, r -> true, Duration.ofSeconds(5)).get("samples").asLong();
            // Binomial(400, 0.2): mean 80, standard deviation sqrt(400 * 0.2 * 0.8) = 8. Five of them either side,
            // [40, 120], fail a correct sampler with probability below 1e-6 (normal tail, common practice).
            double mean = requests * fraction;
            double sd = Math.sqrt(requests * fraction * (1 - fraction));
            assertThat((double) samples).isBetween(mean - 5 * sd, mean + 5 * sd);
        }
    }

    @Test
    void a_stuck_and_a_failing_listener_never_slow_or_fail_a_live_answer_and_the_dropped_samples_are_counted() throws Exception {
        CountDownLatch release = new CountDownLatch(1);
        try (Served s = servingTwo(dir, Served.config().withTapCapacity(2))) {
            String body = items(3, 7);
            Http.Answer reference = s.http.postJson("/models/routing/predict", body);
            s.server.tap().register((model, tag, served, items, results) -> {
                throw new IllegalStateException("a listener bug");
            });
            s.server.tap().register(new TrafficTap.Listener() {
                @Override
                public void onPredict(String model, String tag, Bundle served, List<Map<String, String>> items, List<Prediction> results) {
                    try {
                        release.await(60, TimeUnit.SECONDS);
                    } catch (InterruptedException e) {
                        Thread.currentThread().interrupt();
                    }
                }
            });
            assertThat(s.http.putJson("/models/routing/shadow", "{\"tag\":\"1.1.0\",\"fraction\":1}", Served.AS_ADMIN).status()).isEqualTo(200);
            int requests = 40;
            for (int i = 0; i < requests; i++) {
                Http.Answer answer = s.http.postJson("/models/routing/predict", body);
                assertThat(answer.status()).isEqualTo(200);
                assertThat(answer.body()).isEqualTo(reference.body());
            }
            assertThat(s.server.tap().dropped()).isPositive();
            release.countDown();
            awaitIdle(s);
            JsonNode report = awaitReport(s, r -> true, Duration.ofSeconds(5));
            // every sampled item was either scored or counted as dropped
            assertThat(report.get("samples").asLong() + report.get("dropped").asLong()).isEqualTo(3L * requests);
            assertThat(report.get("dropped").asLong()).isEqualTo(3L * s.server.tap().dropped());
            Scrape scrape = Scrape.of(s.http.get("/metrics").body());
            assertThat(scrape.counter("pressmark_shadow_dropped_total", Map.of("model", "routing", "candidate", "1.1.0")))
                    .isEqualTo(report.get("dropped").asDouble());
            assertThat(scrape.counter("pressmark_tap_dropped_total", Map.of("model", "routing"))).isEqualTo((double) s.server.tap().dropped());
            assertThat(scrape.counter("pressmark_tap_listener_failures_total", Map.of("kind", "IllegalStateException"))).isPositive();
        } finally {
            release.countDown();
        }
    }

    @Test
    @Tag("slow") // waits on the store's change feed, about 4 s
    void a_shadow_started_through_another_store_handle_is_picked_up_within_two_seconds_and_its_report_reaches_the_store() throws Exception {
        try (Served s = servingTwo(dir, Served.config()); var cli = JdbcStores.open(s.storeUrl)) {
            assertThat(s.http.get("/models/routing/shadow").status()).isEqualTo(404);
            long start = System.nanoTime();
            cli.startShadow("routing", "1.1.0", 1.0, "cli");
            String body = items(2, 5);
            long deadline = start + TimeUnit.SECONDS.toNanos(6);
            while (!s.server.shadows().wants("routing")) {
                assertThat(System.nanoTime()).as("picked up within 6 s").isLessThan(deadline);
                Thread.sleep(20);
            }
            assertThat(Duration.ofNanos(System.nanoTime() - start)).isLessThan(Duration.ofSeconds(2));
            for (int i = 0; i < 5; i++) {
                s.http.postJson("/models/routing/predict", body);
            }
            awaitIdle(s);
            // the snapshot is written every few seconds; wait for one with all 10 items
            long saved = System.nanoTime() + TimeUnit.SECONDS.toNanos(15);
            while (cli.shadowReports("routing", Optional.empty()).stream().mapToLong(r -> r.summary().samples()).sum() < 10) {
                assertThat(System.nanoTime()).as("saved within 15 s").isLessThan(saved);
                Thread.sleep(100);
            }
            cli.activate("routing", "1.1.0", "cli", "promoted");
            long stopped = System.nanoTime() + TimeUnit.SECONDS.toNanos(6);
            while (s.server.shadows().wants("routing")) {
                assertThat(System.nanoTime()).as("the promotion ended the run on the server within 6 s").isLessThan(stopped);
                Thread.sleep(20);
            }
            assertThat(s.http.get("/models/routing/shadow").json().get("running").asBoolean()).isFalse();
        }
    }

    @Test
    void bad_shadow_bodies_and_states_are_problem_details_naming_the_field() {
        try (Served s = servingTwo(dir, Served.config())) {
            Http.Answer noTag = s.http.putJson("/models/routing/shadow", "{\"fraction\":0.5}", Served.AS_ADMIN);
            assertThat(noTag.status()).isEqualTo(400);
            assertThat(noTag.contentType()).startsWith("application/problem+json");
            assertThat(noTag.json().at("/errors/0/field").asText()).isEqualTo("tag");

            for (String fraction : new String[] {"0", "1.5", "-0.1", "\"half\"", "null"}) {
                Http.Answer bad = s.http.putJson("/models/routing/shadow", "{\"tag\":\"1.1.0\",\"fraction\":" + fraction + "}", Served.AS_ADMIN);
                assertThat(bad.status()).as(fraction).isEqualTo(400);
                assertThat(bad.json().at("/errors/0/field").asText()).isEqualTo("fraction");
                assertThat(bad.json().get("detail").asText()).contains("(0, 1]");
            }
            Http.Answer unknown = s.http.putJson("/models/routing/shadow", "{\"tag\":\"1.1.0\",\"percent\":20}", Served.AS_ADMIN);
            assertThat(unknown.status()).isEqualTo(400);
            assertThat(unknown.json().at("/errors/0/field").asText()).isEqualTo("percent");
            assertThat(s.http.putJson("/models/routing/shadow", "[1]", Served.AS_ADMIN).status()).isEqualTo(400);

            Http.Answer ofActive = s.http.putJson("/models/routing/shadow", "{\"tag\":\"1.0.0\"}", Served.AS_ADMIN);
            assertThat(ofActive.status()).isEqualTo(409);
            assertThat(ofActive.json().get("type").asText()).isEqualTo("urn:pressmark:problem:shadow-of-active");
            Http.Answer missing = s.http.putJson("/models/routing/shadow", "{\"tag\":\"9.9.9\"}", Served.AS_ADMIN);
            assertThat(missing.status()).isEqualTo(404);
            assertThat(s.http.putJson("/models/nosuch/shadow", "{\"tag\":\"1.1.0\"}", Served.AS_ADMIN).status()).isEqualTo(404);
            assertThat(s.http.putJson("/models/routing/shadow", "{\"tag\":\"1.1.0\"}").status()).isEqualTo(401);
            assertThat(s.http.get("/models/routing/shadow").json().get("type").asText()).isEqualTo("urn:pressmark:problem:no-shadow");

            Http.Answer defaulted = s.http.putJson("/models/routing/shadow", "{\"tag\":\"1.1.0\"}", Served.AS_ADMIN);
            assertThat(defaulted.status()).isEqualTo(200);
            assertThat(defaulted.json().get("fraction").asDouble()).isEqualTo(0.2);
        }
    }

}
