package dev.pressmark.server;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.pressmark.cli.CommandRun;
import dev.pressmark.store.StoreEvent;
import dev.pressmark.store.lifecycle.PromotionPolicy;
import java.nio.file.Path;
import java.util.Optional;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * The promotion check on {@code PUT /models/{name}/active} and {@code pressmark activate}: a
 * good build and one trained with almost no capacity (C = 1e-5, so titles get the commonest
 * label more often), whose recorded balanced accuracy is lower by more than the default margin.
 */
class PromotionTest {

    private static final ObjectMapper JSON = new ObjectMapper();

    private static byte[] good;
    private static byte[] weak;
    private static double goodValue;
    private static double weakValue;

    @TempDir
    Path dir;

    @BeforeAll
    static void train() throws Exception {
        good = TestBundles.svm();
        weak = TestBundles.train(1, "classifier: {kind: linear-svm, c: 0.00001, probabilities: none}");
        goodValue = metric(good);
        weakValue = metric(weak);
        assertThat(goodValue - weakValue).as("the weak build must be clearly worse for these tests to mean anything").isGreaterThan(0.03);
    }

    private static double metric(byte[] bundle) throws Exception {
        JsonNode manifest = JSON.readTree(dev.pressmark.core.bundle.BundleArchive.read(bundle).manifestJson());
        return manifest.at("/metrics/test/balanced_accuracy").asDouble();
    }

    private static Served serving(Path dir, ServerConfig config) {
        return Served.on(dir, config).serving(good).publishing("0.9.0", weak);
    }

    @Test
    void activating_a_clearly_worse_version_over_http_is_a_409_naming_the_metric_both_values_and_the_margin() {
        try (Served s = serving(dir, Served.config())) {
            Http.Answer refused = s.http.putJson("/models/routing/active", "{\"tag\":\"0.9.0\"}", Served.AS_ADMIN);
            assertThat(refused.status()).as(refused.body()).isEqualTo(409);
            assertThat(refused.contentType()).startsWith("application/problem+json");
            assertThat(refused.json().get("type").asText()).isEqualTo("urn:pressmark:problem:promotion-refused");
            assertThat(refused.json().get("detail").asText()).contains("balanced_accuracy", Double.toString(goodValue), Double.toString(weakValue),
                    "0.02");
            JsonNode check = refused.json().at("/checks/0");
            assertThat(check.get("kind").asText()).isEqualTo("metric-drop");
            assertThat(check.get("metric").asText()).isEqualTo("balanced_accuracy");
            assertThat(check.get("source").asText()).isEqualTo("test");
            assertThat(check.get("active").asDouble()).isEqualTo(goodValue);
            assertThat(check.get("candidate").asDouble()).isEqualTo(weakValue);
            assertThat(check.get("limit").asDouble()).isEqualTo(0.02);
            assertThat(s.store.activeVersion("routing").orElseThrow().tag()).isEqualTo("1.0.0");
            assertThat(s.http.postJson("/models/routing/predict", "{\"items\":[{\"title\":\"x\"}]}").json().get("version").asText()).isEqualTo("1.0.0");
        }
    }

    @Test
    void forcing_needs_a_reason_and_then_records_it_with_the_failed_check_in_the_events() {
        try (Served s = serving(dir, Served.config())) {
            Http.Answer noReason = s.http.putJson("/models/routing/active", "{\"tag\":\"0.9.0\",\"force\":true}", Served.AS_ADMIN);
            assertThat(noReason.status()).isEqualTo(400);
            assertThat(noReason.json().at("/errors/0/field").asText()).isEqualTo("reason");
            assertThat(s.http.putJson("/models/routing/active", "{\"tag\":\"0.9.0\",\"force\":\"yes\",\"reason\":\"r\"}", Served.AS_ADMIN).status())
                    .isEqualTo(400);

            Http.Answer forced = s.http.putJson("/models/routing/active", "{\"tag\":\"0.9.0\",\"force\":true,\"reason\":\"incident 42: old labels\"}",
                    Served.AS_ADMIN);
            assertThat(forced.status()).as(forced.body()).isEqualTo(200);
            assertThat(forced.json().get("serving").asText()).isEqualTo("0.9.0");
            assertThat(forced.json().at("/promotion_check/passed").asBoolean()).isFalse();
            assertThat(forced.json().at("/promotion_check/forced").asBoolean()).isTrue();
            StoreEvent event = s.store.events("routing").get(0);
            assertThat(event.action()).isEqualTo(StoreEvent.ACTIVATE);
            assertThat(event.detail()).contains("forced past the promotion check", "balanced_accuracy", "incident 42: old labels");

            // going back to the better version passes the check, and rolling back is never checked
            assertThat(s.http.putJson("/models/routing/active", "{\"tag\":\"1.0.0\"}", Served.AS_ADMIN).status()).isEqualTo(200);
            Http.Answer rolledBack = s.http.post("/models/routing/rollback", "application/json", new byte[0], Served.AS_ADMIN);
            assertThat(rolledBack.status()).as(rolledBack.body()).isEqualTo(200);
            assertThat(rolledBack.json().get("serving").asText()).isEqualTo("0.9.0");
        }
    }

    @Test
    void a_wider_margin_from_the_server_config_lets_the_same_activation_through() {
        PromotionPolicy lenient = PromotionPolicy.defaults().withMaxDrop(1.0);
        try (Served s = serving(dir, Served.config().withPromotion(lenient))) {
            Http.Answer answer = s.http.putJson("/models/routing/active", "{\"tag\":\"0.9.0\"}", Served.AS_ADMIN);
            assertThat(answer.status()).as(answer.body()).isEqualTo(200);
            assertThat(answer.json().at("/promotion_check/passed").asBoolean()).isTrue();
        }
    }

    @Test
    void a_shadow_that_agreed_too_rarely_refuses_the_candidate_when_a_least_agreement_is_configured() throws Exception {
        PromotionPolicy strict = PromotionPolicy.defaults().withMaxDrop(1.0).withMinAgreement(0.99).withMinSamples(20);
        try (Served s = serving(dir, Served.config().withPromotion(strict))) {
            assertThat(s.http.putJson("/models/routing/shadow", "{\"tag\":\"0.9.0\",\"fraction\":1.0}", Served.AS_ADMIN).status()).isEqualTo(200);
            for (int i = 0; i < 10; i++) {
                s.http.postJson("/models/routing/predict", ShadowScoringTest.items(5, i));
            }
            long deadline = System.nanoTime() + 20_000_000_000L;
            while (s.http.get("/models/routing/shadow").json().get("samples").asLong() < 50) {
                assertThat(System.nanoTime()).isLessThan(deadline);
                Thread.sleep(50);
            }
            JsonNode report = s.http.get("/models/routing/shadow").json();
            assertThat(report.get("agreement").asDouble()).as("the weak build labels everything alike, so it disagrees often").isLessThan(0.99);
            Http.Answer refused = s.http.putJson("/models/routing/active", "{\"tag\":\"0.9.0\"}", Served.AS_ADMIN);
            assertThat(refused.status()).as(refused.body()).isEqualTo(409);
            assertThat(refused.json().at("/checks/0/kind").asText()).isEqualTo("shadow-agreement");
            assertThat(refused.json().at("/checks/0/candidate").asDouble()).isEqualTo(report.get("agreement").asDouble());
            assertThat(refused.json().get("detail").asText()).contains("0.99", report.get("agreeing").asText() + " of " + report.get("samples").asText());
        }
    }

    @Test
    @Tag("slow") // child JVMs
    void the_command_line_refuses_with_exit_1_naming_the_metric_both_values_and_the_margin_and_forces_only_with_a_reason() throws Exception {
        try (Served s = serving(dir, Served.config())) {
            CommandRun refused = CommandRun.run(dir, "activate", "routing", "0.9.0", "--store", s.storeUrl);
            assertThat(refused.exitCode()).as(refused.err()).isEqualTo(1);
            assertThat(refused.err()).startsWith("pressmark: not activating routing 0.9.0: balanced_accuracy")
                    .contains(Double.toString(goodValue), Double.toString(weakValue), "0.02", "--force --reason");

            CommandRun noReason = CommandRun.run(dir, "activate", "routing", "0.9.0", "--force", "--store", s.storeUrl);
            assertThat(noReason.exitCode()).isEqualTo(2);
            assertThat(noReason.err()).contains("--force needs --reason");

            CommandRun lenient = CommandRun.run(dir, "activate", "routing", "0.9.0", "--max-drop", "0.9", "--store", s.storeUrl);
            assertThat(lenient.exitCode()).as(lenient.err()).isZero();
            assertThat(lenient.out()).contains("activated routing 0.9.0");

            CommandRun back = CommandRun.run(dir, "rollback", "routing", "--store", s.storeUrl);
            assertThat(back.exitCode()).as(back.err()).isZero();
            CommandRun forced = CommandRun.run(dir, "activate", "routing", "0.9.0", "--force", "--reason", "drill",
                    "--store", s.storeUrl);
            assertThat(forced.exitCode()).as(forced.err()).isZero();
            assertThat(forced.out()).contains("forced past the promotion check", "activated routing 0.9.0");
            assertThat(s.store.events("routing").get(0).detail()).contains("forced past the promotion check", "drill");
        }
    }

    @Test
    @Tag("slow") // child JVMs
    void the_command_line_shadow_reaches_a_running_server_and_shadow_report_reads_the_stored_reports() throws Exception {
        try (Served s = serving(dir, Served.config())) {
            CommandRun started = CommandRun.run(dir, "shadow", "routing", "0.9.0", "--fraction", "1", "--store", s.storeUrl);
            assertThat(started.exitCode()).as(started.err()).isZero();
            assertThat(started.out()).contains("shadowing routing 0.9.0 against the active 1.0.0");
            long deadline = System.nanoTime() + 2_000_000_000L;
            while (!s.server.shadows().wants("routing")) {
                assertThat(System.nanoTime()).as("the server took up the shadow within 2 s of the command's end").isLessThan(deadline);
                Thread.sleep(20);
            }
            for (int i = 0; i < 4; i++) {
                s.http.postJson("/models/routing/predict", ShadowScoringTest.items(5, i));
            }
            CommandRun stop = CommandRun.run(dir, "shadow", "routing", "--stop", "--store", s.storeUrl);
            assertThat(stop.exitCode()).as(stop.err()).isZero();
            assertThat(stop.out()).contains("stopped the shadow of routing 0.9.0");
            long saved = System.nanoTime() + 10_000_000_000L;
            while (s.store.shadowReports("routing", Optional.empty()).stream().mapToLong(r -> r.summary().samples()).sum() < 20) {
                assertThat(System.nanoTime()).as("the final report saved within 10 s").isLessThan(saved);
                Thread.sleep(50);
            }
            CommandRun json = CommandRun.run(dir, "shadow-report", "routing", "--json", "--store", s.storeUrl);
            assertThat(json.exitCode()).as(json.err()).isZero();
            JsonNode report = JSON.readTree(json.out());
            JsonNode served = s.http.get("/models/routing/shadow").json();
            assertThat(report.get("samples").asLong()).isEqualTo(20);
            assertThat(report.get("running").asBoolean()).isFalse();
            assertThat(report).isEqualTo(served);
            CommandRun text = CommandRun.run(dir, "shadow-report", "routing", "--store", s.storeUrl);
            assertThat(text.out()).contains("shadow of routing 0.9.0 against 1.0.0, stopped", "items scored 20");

            CommandRun usage = CommandRun.run(dir, "shadow", "routing", "--store", s.storeUrl);
            assertThat(usage.exitCode()).isEqualTo(2);
        }
    }
}
