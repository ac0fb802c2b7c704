package dev.pressmark.apicheck;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import dev.pressmark.apiclient.ApiClient;
import dev.pressmark.apiclient.ApiException;
import dev.pressmark.apiclient.api.HealthApi;
import dev.pressmark.apiclient.api.ModelRoutingApi;
import dev.pressmark.apiclient.api.ModelShopListingsApi;
import dev.pressmark.apiclient.api.ModelsApi;
import dev.pressmark.apiclient.model.DriftReport;
import dev.pressmark.apiclient.model.ExplainResponseRouting;
import dev.pressmark.apiclient.model.ItemRouting;
import dev.pressmark.apiclient.model.ItemShopListings;
import dev.pressmark.apiclient.model.LabelRouting;
import dev.pressmark.apiclient.model.PredictRequestRouting;
import dev.pressmark.apiclient.model.PredictRequestShopListings;
import dev.pressmark.apiclient.model.PredictResponseRouting;
import dev.pressmark.apiclient.model.PredictResponseShopListings;
import dev.pressmark.apiclient.model.PredictionRouting;
import dev.pressmark.apiclient.model.Problem;
import dev.pressmark.apiclient.model.ProbabilitiesRouting;
import dev.pressmark.apiclient.model.VersionDetail;
import dev.pressmark.server.LiveFixture;
import java.io.IOException;
import java.nio.file.Path;
import java.util.Arrays;
import java.util.List;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * A client that OpenAPI Generator (org.openapitools, generator "java", library "native") made
 * from a live server's /openapi.json during this build calls another live server through its
 * typed API. If the document described the answers wrongly, deserialising them would fail.
 */
@Tag("slow") // needs the client generated from a live document during the build
class GeneratedClientTest {

    /** Platt probabilities are rounded doubles: their sum is 1 to within a few ulps. */
    private static final double SUM_TOLERANCE = 1e-9;

    private static LiveFixture fixture;

    @BeforeAll
    static void start(@TempDir Path dir) {
        fixture = LiveFixture.start(dir);
    }

    @AfterAll
    static void stop() {
        if (fixture != null) {
            fixture.close();
        }
    }

    private static ApiClient client() {
        ApiClient client = new ApiClient();
        client.updateBaseUri(fixture.baseUri());
        return client;
    }

    @Test
    void the_generated_label_enum_is_the_served_model_s_label_set() {
        assertThat(Arrays.stream(LabelRouting.values()).map(LabelRouting::getValue)).containsExactlyInAnyOrderElementsOf(fixture.labels());
    }

    @Test
    void predict_through_the_typed_client_returns_typed_labels_from_the_active_version() throws ApiException {
        ModelRoutingApi routing = new ModelRoutingApi(client());
        PredictResponseRouting response = routing.predictRouting(new PredictRequestRouting().items(List.of(
                new ItemRouting().title("aquaflow valve pro"), new ItemRouting().title("fernleaf rake kit"))));

        assertThat(response.getModel()).isEqualTo(PredictResponseRouting.ModelEnum.ROUTING);
        assertThat(response.getVersion()).isEqualTo(LiveFixture.TAG);
        assertThat(response.getResults()).hasSize(2);
        for (PredictionRouting prediction : response.getResults()) {
            assertThat(prediction.getLabel().getValue()).isIn(fixture.labels());
            ProbabilitiesRouting p = prediction.getProbabilities();
            assertThat(p.getElectrical() + p.getGarden() + p.getPlumbing()).isCloseTo(1.0, within(SUM_TOLERANCE));
        }

        ExplainResponseRouting explained = routing.explainRouting(new PredictRequestRouting().items(List.of(
                new ItemRouting().title("aquaflow valve pro"))), 3);
        assertThat(explained.getVersion()).isEqualTo(LiveFixture.TAG);
        assertThat(explained.getResults().get(0).getLabel()).isEqualTo(response.getResults().get(0).getLabel());
        assertThat(explained.getResults().get(0).getContributions()).hasSizeLessThanOrEqualTo(3).isNotEmpty();

        PredictResponseShopListings other = new ModelShopListingsApi(client()).predictShopListings(
                new PredictRequestShopListings().items(List.of(new ItemShopListings().title("voltamp breaker black"))));
        assertThat(other.getModel()).isEqualTo(PredictResponseShopListings.ModelEnum.SHOP_LISTINGS);
        assertThat(other.getResults().get(0).getLabel().getValue()).isIn(fixture.labels());
    }

    @Test
    void metadata_through_the_typed_client_names_the_active_version_and_its_contract() throws ApiException {
        ModelsApi models = new ModelsApi(client());
        VersionDetail active = models.getModel(LiveFixture.MODEL);
        assertThat(active.getTag()).isEqualTo(LiveFixture.TAG);
        assertThat(active.getModel()).isEqualTo(LiveFixture.MODEL);
        assertThat(active.getActive()).isTrue();
        assertThat(active.getLabels()).containsExactlyElementsOf(fixture.labels());
        assertThat(active.getInputFields()).containsExactly("title");
        assertThat(active.getSha256()).hasSize(64);
        assertThat(active.getCreatedAt()).isNotNull();

        assertThat(models.listModels().getModels()).extracting(m -> m.getName()).containsExactly(LiveFixture.MODEL, LiveFixture.SECOND_MODEL);
        assertThat(models.listVersions(LiveFixture.SECOND_MODEL).getVersions()).extracting(v -> v.getTag()).containsExactly(LiveFixture.TAG);
        assertThat(new HealthApi(client()).getReadiness().getStatus().getValue()).isEqualTo("ready");
    }

    @Test
    void the_drift_window_reads_through_the_typed_client() throws ApiException {
        DriftReport drift = new ModelsApi(client()).getDrift(LiveFixture.MODEL);
        assertThat(drift.getModel()).isEqualTo(LiveFixture.MODEL);
        assertThat(drift.getVersion()).isEqualTo(LiveFixture.TAG);
        assertThat(drift.getWindowItems()).isNotNegative();
        assertThat(drift.getUnknownRate().getTraining().doubleValue()).isBetween(0.0, 1.0);
    }

    @Test
    void an_error_answer_reads_as_the_documented_problem_detail() {
        ApiClient client = client();
        assertThatThrownBy(() -> new ModelsApi(client).getModel("no-such-model"))
                .isInstanceOfSatisfying(ApiException.class, e -> {
                    assertThat(e.getCode()).isEqualTo(404);
                    Problem problem = read(client, e.getResponseBody());
                    assertThat(problem.getStatus()).isEqualTo(404);
                    assertThat(problem.getType().toString()).startsWith("urn:pressmark:problem:");
                    assertThat(problem.getInstance().toString()).isEqualTo("/models/no-such-model");
                });
    }

    private static Problem read(ApiClient client, String body) {
        try {
            return client.getObjectMapper().readValue(body, Problem.class);
        } catch (IOException e) {
            throw new AssertionError("the problem detail does not read as the documented Problem: " + body, e);
        }
    }
}
