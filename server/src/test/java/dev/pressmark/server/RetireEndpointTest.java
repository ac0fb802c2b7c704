package dev.pressmark.server;

import static org.assertj.core.api.Assertions.assertThat;

import dev.pressmark.store.StoreEvent;
import java.nio.file.Path;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * {@code POST /models/{name}/versions/{tag}/retire} on a real server over a real SQLite store:
 * the store's retire rules as RFC 9457 problems (section 3.1's members), and a retired version
 * that stays readable.
 */
class RetireEndpointTest {

    private static final String RETIRE_090 = "/models/routing/versions/0.9.0/retire";

    private static byte[] good;
    private static byte[] weak;

    @TempDir
    Path dir;

    @BeforeAll
    static void train() {
        good = TestBundles.svm();
        // almost no capacity (C = 1e-5): the promotion check refuses it against the good build, as PromotionTest shows
        weak = TestBundles.train(1, "classifier: {kind: linear-svm, c: 0.00001, probabilities: none}");
    }

    private Served serving() {
        return Served.on(dir).serving(good).publishing("0.9.0", weak);
    }

    @Test
    void retiring_records_the_reason_and_the_version_stays_readable_and_predicts_by_its_tag() {
        try (Served s = serving()) {
            Http.Answer retired = s.http.postJson(RETIRE_090, "{\"reason\":\"trained on the broken export\"}", Served.AS_ADMIN);
            assertThat(retired.status()).as(retired.body()).isEqualTo(200);
            assertThat(retired.json().get("tag").asText()).isEqualTo("0.9.0");
            assertThat(retired.json().get("retired").asBoolean()).isTrue();
            assertThat(retired.json().get("active").asBoolean()).isFalse();

            StoreEvent event = s.store.events("routing").get(0);
            assertThat(event.action()).isEqualTo(StoreEvent.RETIRE);
            assertThat(event.tag()).isEqualTo("0.9.0");
            assertThat(event.actor()).isEqualTo(ModelRoutes.ACTOR);
            assertThat(event.detail()).isEqualTo("trained on the broken export");

            Http.Answer read = s.http.get("/models/routing/versions/0.9.0");
            assertThat(read.status()).isEqualTo(200);
            assertThat(read.json().get("retired").asBoolean()).isTrue();
            assertThat(s.http.get("/models/routing/versions").json().at("/versions/0/retired").asBoolean()).isTrue();
            Http.Answer predicted = s.http.postJson("/models/routing/versions/0.9.0/predict", "{\"items\":[{\"title\":\"voltamp outlet pro\"}]}");
            assertThat(predicted.status()).as(predicted.body()).isEqualTo(200);
            assertThat(predicted.json().get("version").asText()).isEqualTo("0.9.0");
            assertThat(s.servedVersion()).isEqualTo("1.0.0");
        }
    }

    @Test
    void a_retired_version_is_a_409_version_retired_on_activation_even_where_the_promotion_check_would_refuse_it() {
        try (Served s = serving()) {
            assertThat(s.http.postJson(RETIRE_090, "{\"reason\":\"superseded\"}", Served.AS_ADMIN).status()).isEqualTo(200);
            for (String body : new String[] {"{\"tag\":\"0.9.0\"}", "{\"tag\":\"0.9.0\",\"force\":true,\"reason\":\"urgent\"}"}) {
                Http.Answer refused = s.http.putJson("/models/routing/active", body, Served.AS_ADMIN);
                assertProblem(refused, 409, "version-retired", "/models/routing/active");
                assertThat(refused.json().get("detail").asText()).isEqualTo("routing 0.9.0 is retired and cannot be activated");
            }
            assertThat(s.servedVersion()).isEqualTo("1.0.0");
        }
    }

    @Test
    void retiring_twice_or_the_active_version_is_a_409_with_a_stable_type_and_changes_nothing() {
        try (Served s = serving()) {
            Http.Answer active = s.http.postJson("/models/routing/versions/1.0.0/retire", "{\"reason\":\"old\"}", Served.AS_ADMIN);
            assertProblem(active, 409, "version-active", "/models/routing/versions/1.0.0/retire");
            assertThat(s.http.postJson(RETIRE_090, "{\"reason\":\"superseded\"}", Served.AS_ADMIN).status()).isEqualTo(200);
            int events = s.store.events("routing").size();
            Http.Answer twice = s.http.postJson(RETIRE_090, "{\"reason\":\"again\"}", Served.AS_ADMIN);
            assertProblem(twice, 409, "already-retired", RETIRE_090);
            assertThat(twice.json().get("detail").asText()).isEqualTo("routing 0.9.0 is already retired");
            assertThat(s.store.events("routing")).hasSize(events);
            assertThat(s.store.version("routing", "1.0.0").orElseThrow().retired()).isFalse();
        }
    }

    @Test
    void a_missing_blank_or_mistyped_reason_an_unknown_member_version_or_token_is_refused_before_anything_changes() {
        try (Served s = serving()) {
            for (String body : new String[] {"{}", "{\"reason\":\"  \"}", "{\"reason\":7}", "[]"}) {
                Http.Answer bad = s.http.postJson(RETIRE_090, body, Served.AS_ADMIN);
                assertProblem(bad, 400, "invalid-request", RETIRE_090);
                assertThat(bad.json().at("/errors/0/field").asText()).as(body).isIn("reason", "(body)");
            }
            Http.Answer extra = s.http.postJson(RETIRE_090, "{\"reason\":\"x\",\"force\":true}", Served.AS_ADMIN);
            assertThat(extra.status()).isEqualTo(400);
            assertThat(extra.json().at("/errors/0/field").asText()).isEqualTo("force");
            assertProblem(s.http.postJson("/models/routing/versions/7.7.7/retire", "{\"reason\":\"x\"}", Served.AS_ADMIN), 404, "no-such-version",
                    "/models/routing/versions/7.7.7/retire");
            assertProblem(s.http.postJson(RETIRE_090, "{\"reason\":\"x\"}"), 401, "unauthorized", RETIRE_090);
            assertThat(s.http.postJson(RETIRE_090, "{\"reason\":\"x\"}", "Authorization", "Bearer wrong").status()).isEqualTo(401);
            assertThat(s.store.version("routing", "0.9.0").orElseThrow().retired()).isFalse();
        }
    }

    /** RFC 9457, section 3.1: type, title, status, detail and instance, as application/problem+json. */
    private static void assertProblem(Http.Answer answer, int status, String type, String instance) {
        assertThat(answer.status()).as(answer.body()).isEqualTo(status);
        assertThat(answer.contentType()).startsWith("application/problem+json");
        assertThat(answer.json().get("type").asText()).isEqualTo("urn:pressmark:problem:" + type);
        assertThat(answer.json().get("status").asInt()).isEqualTo(status);
        assertThat(answer.json().get("title").asText()).isNotBlank();
        assertThat(answer.json().get("detail").asText()).isNotBlank();
        assertThat(answer.json().get("instance").asText()).isEqualTo(instance);
    }
}
