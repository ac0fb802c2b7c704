package dev.pressmark.server;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.databind.JsonNode;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;
import org.hawkular.agent.prometheus.types.Histogram;
import org.hawkular.agent.prometheus.types.Summary;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * {@code GET /metrics} on a live server, read back with an independent parser of the Prometheus
 * text format (see {@link Scrape}): each count must be exactly what the test sent.
 */
class MetricsEndpointTest {

    private static final String REQUESTS = "pressmark_http_requests_seconds";
    private static final String PREDICTIONS = "pressmark_predictions_total";
    private static final String ACTIVE = "pressmark_active_version_info";
    private static final String BUNDLE_LOAD = "pressmark_bundle_load_seconds";
    /** The latency buckets' upper bounds in seconds, as the service documents them, then +Inf. */
    private static final double[] BUCKETS = {0.0005, 0.001, 0.002, 0.005, 0.01, 0.025, 0.05, 0.1, 0.25, 0.5, 1.0, Double.POSITIVE_INFINITY};
    /** The request logger runs once the answer is on its way, so a scrape right after may not see it yet. */
    private static final Duration SETTLE = Duration.ofSeconds(10);
    private static final long POLL_MS = 20;

    private static final byte[] svm = TestBundles.svm();
    private static final byte[] logistic = TestBundles.logistic();

    @TempDir
    Path dir;

    @Test
    void the_scrape_is_prometheus_text_format_with_process_and_jvm_meters() {
        try (Served s = Served.on(dir)) {
            Http.Answer answer = s.http.get("/metrics");
            assertThat(answer.status()).isEqualTo(200);
            // the content type the text format 0.0.4 specifies (prometheus.io, "Exposition formats")
            assertThat(answer.contentType()).isEqualTo("text/plain; version=0.0.4; charset=utf-8");
            Scrape scrape = Scrape.of(answer.body());
            assertThat(scrape.has("process_uptime_seconds")).isTrue();
            assertThat(scrape.has("jvm_memory_used_bytes")).isTrue();
            assertThat(scrape.has("jvm_threads_live_threads")).isTrue();
        }
    }

    @Test
    void each_request_is_counted_once_by_route_template_model_version_method_and_status() throws InterruptedException {
        try (Served s = Served.on(dir)) {
            s.serving(svm);
            List<JsonNode> answers = new ArrayList<>();
            for (int n = 1; n <= 3; n++) {
                answers.add(expect(s.http.postJson("/models/routing/predict", items(n)), 200).json());
            }
            expect(s.http.postJson("/models/routing/predict", "{\"items\": 5}"), 400);
            answers.add(expect(s.http.postJson("/models/routing/versions/1.0.0/predict", items(1)), 200).json());
            expect(s.http.get("/no/such/endpoint"), 404);
            expect(s.http.get("/no/such/endpoint"), 404);
            expect(s.http.get("/models/made-up-1"), 404);
            expect(s.http.get("/models/made-up-2"), 404);
            expect(s.http.putJson("/models/routing/active", "{\"tag\":\"1.0.0\"}"), 401);
            expect(s.http.get("/health"), 200);

            Scrape scrape = settled(s, 3 + 1 + 1 + 2 + 2 + 1 + 1);
            assertThat(count(scrape, "POST", "/models/{name}/predict", "routing", "1.0.0", 200)).isEqualTo(3);
            assertThat(count(scrape, "POST", "/models/{name}/predict", "routing", "1.0.0", 400)).isEqualTo(1);
            assertThat(count(scrape, "POST", "/models/{name}/versions/{tag}/predict", "routing", "1.0.0", 200)).isEqualTo(1);
            assertThat(count(scrape, "GET", Metrics.UNMATCHED, "", "", 404)).isEqualTo(2);
            // names of models that do not exist stay out of the labels
            assertThat(count(scrape, "GET", "/models/{name}", "", "", 404)).isEqualTo(2);
            assertThat(count(scrape, "PUT", "/models/{name}/active", "routing", "", 401)).isEqualTo(1);
            assertThat(count(scrape, "GET", "/health", "", "", 200)).isEqualTo(1);
            assertThat(scrape.histograms(REQUESTS)).allSatisfy(h -> assertThat(h.getLabels().get("model")).isIn("", "routing"));

            Map<String, Integer> labels = new TreeMap<>();
            for (JsonNode answer : answers) {
                answer.get("results").forEach(r -> labels.merge(r.get("label").asText(), 1, Integer::sum));
            }
            assertThat(labels.values().stream().mapToInt(Integer::intValue).sum()).isEqualTo(1 + 2 + 3 + 1);
            labels.forEach((label, n) -> assertThat(scrape.counter(PREDICTIONS, Map.of("model", "routing", "version", "1.0.0", "label", label)))
                    .as(label).isEqualTo(n.doubleValue()));
            assertThat(scrape.series(PREDICTIONS)).hasSize(labels.size());
        }
    }

    @Test
    void every_latency_histogram_is_cumulative_over_the_documented_buckets_and_ends_at_its_count() throws InterruptedException {
        try (Served s = Served.on(dir)) {
            s.serving(svm);
            for (int i = 0; i < 5; i++) {
                expect(s.http.postJson("/models/routing/predict", items(1 + i)), 200);
                expect(s.http.get("/models/nope-" + i), 404);
            }
            Scrape scrape = settled(s, 10);
            assertThat(scrape.histograms(REQUESTS)).isNotEmpty().allSatisfy(h -> {
                List<Histogram.Bucket> buckets = h.getBuckets();
                assertThat(buckets).extracting(Histogram.Bucket::getUpperBound).containsExactly(box(BUCKETS));
                for (int i = 1; i < buckets.size(); i++) {
                    assertThat(buckets.get(i).getCumulativeCount()).as("bucket %d of %s", i, h.getLabels())
                            .isGreaterThanOrEqualTo(buckets.get(i - 1).getCumulativeCount());
                }
                assertThat(buckets.get(buckets.size() - 1).getCumulativeCount()).isEqualTo(h.getSampleCount());
                assertThat(h.getSampleSum()).isPositive();
            });
        }
    }

    @Test
    void the_active_version_gauge_moves_to_the_newly_activated_version_and_each_load_is_timed() {
        try (Served s = Served.on(dir)) {
            s.store.publish("routing", "1.0.0", svm, "test");
            s.store.publish("routing", "1.1.0", logistic, "test");
            s.store.activate("routing", "1.0.0", "test", "first");
            expect(s.http.postJson("/models/routing/predict", items(1)), 200);
            assertThat(Scrape.of(s.http.get("/metrics").body()).gauges(ACTIVE))
                    .containsExactly(Map.entry(Map.of("model", "routing", "version", "1.0.0"), 1.0));

            expect(s.http.putJson("/models/routing/active", "{\"tag\":\"1.1.0\"}", Served.AS_ADMIN), 200);
            Scrape after = Scrape.of(s.http.get("/metrics").body());
            assertThat(after.gauges(ACTIVE)).containsExactly(Map.entry(Map.of("model", "routing", "version", "1.1.0"), 1.0));
            Summary loads = after.summary(BUNDLE_LOAD, Map.of("model", "routing"));
            assertThat(loads.getSampleCount()).isEqualTo(2);
            assertThat(loads.getSampleSum()).isPositive();
        }
    }

    /** Scrapes until the requests other than the scrapes themselves add up to {@code expected}. */
    private static Scrape settled(Served s, long expected) throws InterruptedException {
        long deadline = System.nanoTime() + SETTLE.toNanos();
        while (true) {
            Scrape scrape = Scrape.of(expect(s.http.get("/metrics"), 200).body());
            long seen = 0;
            for (Histogram h : scrape.histograms(REQUESTS)) {
                if (!h.getLabels().get("route").equals("/metrics")) {
                    seen += h.getSampleCount();
                }
            }
            if (seen >= expected || System.nanoTime() > deadline) {
                assertThat(seen).as("requests counted").isEqualTo(expected);
                return scrape;
            }
            Thread.sleep(POLL_MS);
        }
    }

    private static long count(Scrape scrape, String method, String route, String model, String version, int status) {
        Histogram h = scrape.histogram(REQUESTS, Map.of("method", method, "route", route, "model", model, "version", version, "status",
                Integer.toString(status)));
        return h == null ? 0 : h.getSampleCount();
    }

    private static Http.Answer expect(Http.Answer answer, int status) {
        assertThat(answer.status()).as(answer.body()).isEqualTo(status);
        return answer;
    }

    private static String items(int n) {
        String[] titles = {"aquaflow valve pro", "voltamp breaker kit", "fernleaf rake pack", "aquavolt drain steel", "leafflow hose black"};
        StringBuilder json = new StringBuilder("{\"items\":[");
        for (int i = 0; i < n; i++) {
            json.append(i == 0 ? "" : ",").append("{\"title\":\"").append(titles[i % titles.length]).append("\"}");
        }
        return json.append("]}").toString();
    }

    private static Double[] box(double[] values) {
        Double[] boxed = new Double[values.length];
        for (int i = 0; i < values.length; i++) {
            boxed[i] = values[i];
        }
        return boxed;
    }
}
