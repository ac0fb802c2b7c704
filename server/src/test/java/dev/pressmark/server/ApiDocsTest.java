package dev.pressmark.server;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.dataformat.yaml.YAMLMapper;
import dev.pressmark.core.Progress;
import dev.pressmark.core.bundle.Bundle;
import dev.pressmark.core.train.BundleTrainer;
import dev.pressmark.core.train.TrainPlan;
import dev.pressmark.openapi.Descriptors;
import dev.pressmark.openapi.ModelDescriptor;
import dev.pressmark.openapi.ModelExample;
import io.swagger.parser.OpenAPIParser;
import io.swagger.v3.oas.models.OpenAPI;
import io.swagger.v3.oas.models.media.Schema;
import io.swagger.v3.parser.core.models.ParseOptions;
import io.swagger.v3.parser.core.models.SwaggerParseResult;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import java.util.SplittableRandom;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * The live document and the documentation page, read by outside tools: swagger-parser
 * (io.swagger.parser.v3) must read the served JSON and YAML without a message.
 */
class ApiDocsTest {

    private static final ObjectMapper JSON = new ObjectMapper();
    private static final Pattern ASSET = Pattern.compile("(?:src|href)=\"([^\"]+)\"");

    private static byte[] threeLabels;
    private static byte[] twoLabels;

    @TempDir
    Path dir;

    @BeforeAll
    static void train(@TempDir Path trainDir) throws IOException {
        threeLabels = TestBundles.svm();
        twoLabels = twoDepartments(trainDir.resolve("two"));
    }

    /** A model with another label set than {@link TestBundles}' three departments. */
    private static byte[] twoDepartments(Path dir) throws IOException {
        Files.createDirectories(dir);
        StringBuilder csv = new StringBuilder("title,department\n");
        SplittableRandom random = new SplittableRandom(5);
        String[][] words = {{"lamp", "bulb", "shade", "socket"}, {"sofa", "chair", "table", "stool"}};
        String[] labels = {"lighting", "furniture"};
        for (int i = 0; i < 200; i++) {
            int k = random.nextInt(2);
            csv.append(words[k][random.nextInt(4)]).append(' ').append(words[k][random.nextInt(4)]).append(" oak,").append(labels[k]).append('\n');
        }
        Files.writeString(dir.resolve("listings.csv"), csv);
        Path yaml = dir.resolve("train.yaml");
        Files.writeString(yaml, "name: routing\ndata: {file: listings.csv, text: [title], label: department}\n"
                + "tokenizer: {vocab_size: 80}\nfeatures: {max_tokens: 100}\nclassifier: {kind: logistic-regression}\n"
                + "evaluation: {folds: 2, threads: 1}\n");
        return BundleTrainer.train(TrainPlan.read(yaml), Instant.parse("2026-01-01T00:00:00Z"), Progress.NONE).bytes();
    }

    private static OpenAPI parsedCleanly(String text) {
        ParseOptions options = new ParseOptions();
        options.setResolve(true);
        SwaggerParseResult result = new OpenAPIParser().readContents(text, null, options);
        assertThat(result.getMessages()).as("swagger-parser messages").isEmpty();
        assertThat(result.getOpenAPI()).isNotNull();
        return result.getOpenAPI();
    }

    private static List<Object> labelEnum(OpenAPI api) {
        Schema<?> labels = api.getComponents().getSchemas().get("Label_routing");
        return new ArrayList<>(labels.getEnum());
    }

    @Test
    void the_served_json_and_yaml_parse_without_messages_and_say_the_same() throws IOException {
        try (Served s = Served.on(dir)) {
            s.serving(threeLabels);

            Http.Answer json = s.http.get("/openapi.json");
            assertThat(json.status()).isEqualTo(200);
            assertThat(json.contentType()).startsWith("application/json");
            Http.Answer yaml = s.http.get("/openapi.yaml");
            assertThat(yaml.status()).isEqualTo(200);
            assertThat(yaml.contentType()).startsWith("application/yaml");

            OpenAPI fromJson = parsedCleanly(json.body());
            parsedCleanly(yaml.body());
            assertThat(fromJson.getOpenapi()).isEqualTo("3.1.0");
            assertThat(labelEnum(fromJson)).containsExactlyElementsOf(Bundle.read(threeLabels).labels());
            Schema<?> item = fromJson.getComponents().getSchemas().get("Item_routing");
            assertThat(item.getRequired()).containsExactly("title");
            // Jackson's YAML reader, independent of the writer, gets the same tree as from the JSON
            assertThat(new YAMLMapper().readTree(yaml.body())).isEqualTo(JSON.readTree(json.body()));
        }
    }

    @Test
    void activating_a_version_with_other_labels_changes_the_document() {
        try (Served s = Served.on(dir)) {
            s.serving(threeLabels);
            OpenAPI before = parsedCleanly(s.http.get("/openapi.json").body());
            assertThat(labelEnum(before)).containsExactly("electrical", "garden", "plumbing");
            assertThat(before.getInfo().getDescription()).contains("routing 1.0.0");

            assertThat(before.getInfo().getVersion()).isEqualTo("1.0.0");

            // other labels remove the old ones: a breaking contract change, published only when allowed
            assertThat(s.http.put("/models/routing/versions/2.0.0", "application/octet-stream", twoLabels, Served.AS_ADMIN).status())
                    .isEqualTo(409);
            assertThat(s.http.put("/models/routing/versions/2.0.0?allow_breaking=true", "application/octet-stream", twoLabels, Served.AS_ADMIN)
                    .status()).isEqualTo(201);
            assertThat(s.http.putJson("/models/routing/active", "{\"tag\":\"2.0.0\"}", Served.AS_ADMIN).status()).isEqualTo(200);

            OpenAPI after = parsedCleanly(s.http.get("/openapi.json").body());
            assertThat(labelEnum(after)).containsExactlyElementsOf(Bundle.read(twoLabels).labels()).containsExactly("furniture", "lighting");
            assertThat(after.getInfo().getDescription()).contains("routing 2.0.0 (contract 2.0.0)");
            assertThat(after.getInfo().getVersion()).isEqualTo("2.0.0");
            assertThat(parsedCleanly(s.http.get("/openapi.yaml").body()).getInfo().getDescription()).contains("routing 2.0.0");
        }
    }

    @Test
    void the_document_s_example_request_gets_the_example_answer_from_the_server() throws IOException {
        try (Served s = Served.on(dir)) {
            s.serving(threeLabels);
            JsonNode doc = s.http.get("/openapi.json").json();
            JsonNode operation = doc.at("/paths/~1models~1routing~1predict/post");
            JsonNode request = operation.at("/requestBody/content/application~1json/examples/typical/value");
            JsonNode response = operation.at("/responses/200/content/application~1json/examples/typical/value");
            assertThat(request.get("items")).hasSize(3);

            Http.Answer answer = s.http.postJson("/models/routing/predict", JSON.writeValueAsString(request));
            assertThat(answer.status()).as(answer.body()).isEqualTo(200);
            assertThat(answer.json()).isEqualTo(response);
            // made of the words weighted most towards each label, each example lands on its own label
            assertThat(answer.json().get("results")).extracting(r -> r.get("label").asText())
                    .containsExactlyElementsOf(Bundle.read(threeLabels).labels());
        }
    }

    @Test
    void a_binary_model_s_examples_are_made_for_each_of_its_two_labels() {
        Bundle binary = Bundle.read(twoLabels);
        ModelDescriptor described = Descriptors.of("routing", "2.0.0", binary);
        assertThat(described.examples()).hasSize(2);
        // the bundle itself, not the descriptor, says what each example item is
        assertThat(binary.predict(described.examples().get(0).item()).label()).isEqualTo("furniture");
        assertThat(binary.predict(described.examples().get(1).item()).label()).isEqualTo("lighting");
        assertThat(described.examples()).extracting(ModelExample::label).containsExactly("furniture", "lighting");
        assertThat(described.probabilities()).isTrue();
    }

    @Test
    void the_documents_need_the_reader_token_when_the_server_has_one_and_say_that_reading_operations_do() {
        ServerConfig config = Served.config()
                .withReaderToken(Optional.of(BearerToken.of(Served.READER)));
        try (Served s = Served.on(dir, config)) {
            s.serving(threeLabels);
            assertThat(s.http.get("/models").status()).isEqualTo(401);
            assertThat(s.http.get("/openapi.json").status()).isEqualTo(401);
            assertThat(s.http.get("/openapi.yaml").status()).isEqualTo(401);
            String[] asReader = {"Authorization", "Bearer " + Served.READER};
            Http.Answer json = s.http.get("/openapi.json", asReader);
            assertThat(json.status()).isEqualTo(200);
            OpenAPI api = parsedCleanly(json.body());
            assertThat(api.getPaths().get("/models").getGet().getSecurity()).hasSize(1);
            assertThat(api.getPaths().get("/models/routing/predict").getPost().getSecurity()).hasSize(1);
            assertThat(s.http.get("/openapi.yaml", asReader).status()).isEqualTo(200);
            assertThat(s.http.get("/docs").status()).isEqualTo(200);
        }
    }

    @Test
    void the_docs_page_loads_only_assets_of_this_server_and_each_of_them_answers() {
        try (Served s = Served.on(dir)) {
            Http.Answer page = s.http.get("/docs");
            assertThat(page.status()).isEqualTo(200);
            assertThat(page.contentType()).startsWith("text/html");
            List<String> urls = new ArrayList<>();
            Matcher m = ASSET.matcher(page.body());
            while (m.find()) {
                urls.add(m.group(1));
            }
            assertThat(urls).contains("/docs/assets/swagger-ui-bundle.js", "/docs/assets/swagger-ui.css", "/docs/assets/pressmark-docs.js");
            assertThat(page.body()).doesNotContain("<script>");
            for (String url : urls) {
                assertThat(url).as("a local path").startsWith("/").doesNotStartWith("//");
                Http.Answer asset = s.http.get(url);
                assertThat(asset.status()).as(url).isEqualTo(200);
                assertThat(asset.body()).as(url).isNotEmpty();
            }
            Http.Answer script = s.http.get("/docs/assets/pressmark-docs.js");
            assertThat(script.contentType()).startsWith("text/javascript");
            assertThat(script.body()).contains("\"/openapi.json\"").doesNotContain("http:").doesNotContain("https:");
            assertThat(s.http.get("/docs/assets/swagger-ui.css").contentType()).startsWith("text/css");
            Http.Answer missing = s.http.get("/docs/assets/index.html");
            assertThat(missing.status()).isEqualTo(404);
            assertThat(missing.contentType()).startsWith(Problems.CONTENT_TYPE);
            assertThat(s.http.get("/docs/assets/..%2Fpom.properties").status()).isEqualTo(404);
        }
    }
}
