package dev.pressmark.openapi;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import io.swagger.parser.OpenAPIParser;
import io.swagger.v3.oas.models.OpenAPI;
import io.swagger.v3.oas.models.Operation;
import io.swagger.v3.oas.models.PathItem;
import io.swagger.v3.oas.models.media.Schema;
import io.swagger.v3.oas.models.responses.ApiResponse;
import io.swagger.v3.parser.core.models.ParseOptions;
import io.swagger.v3.parser.core.models.SwaggerParseResult;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;

/**
 * The document as an outside reader sees it: swagger-parser (io.swagger.parser.v3, the OpenAPI
 * Initiative's reference Java parser family) reads what we write and must report nothing.
 */
class ApiDocumentTest {

    private static final ModelDescriptor ROUTING = new ModelDescriptor("routing", "1.4.0", List.of("plumbing", "electrical", "garden"),
            List.of("title"), true, List.of(new ModelExample(Map.of("title", "aqua valve"), "plumbing", 1.25,
                    Map.of("plumbing", 0.8, "electrical", 0.15, "garden", 0.05))));
    private static final ModelDescriptor SPAM = new ModelDescriptor("spam-filter", "2026.01", List.of("ham", "spam"),
            List.of("subject", "sender"), false, List.of(new ModelExample(Map.of("subject", "win now", "sender", "prize"), "spam", 0.7,
                    Map.of())));

    private static SwaggerParseResult parse(String text) {
        ParseOptions options = new ParseOptions();
        options.setResolve(true);
        return new OpenAPIParser().readContents(text, null, options);
    }

    private static OpenAPI parsedCleanly(String text) {
        SwaggerParseResult result = parse(text);
        assertThat(result.getMessages()).as("swagger-parser messages").isEmpty();
        assertThat(result.getOpenAPI()).isNotNull();
        return result.getOpenAPI();
    }

    private static Schema<?> schema(OpenAPI api, String name) {
        Schema<?> schema = api.getComponents().getSchemas().get(name);
        assertThat(schema).as(name).isNotNull();
        return schema;
    }

    private static List<Object> enumOf(OpenAPI api, String name) {
        return new ArrayList<>(schema(api, name).getEnum());
    }

    @Test
    void the_json_and_the_yaml_of_two_models_parse_without_messages_as_openapi_3_1() {
        OpenAPI api = ApiDocument.build(new ServiceInfo("0.1.0", false), List.of(SPAM, ROUTING));
        for (String text : List.of(ApiDocument.json(api), ApiDocument.yaml(api))) {
            OpenAPI parsed = parsedCleanly(text);
            assertThat(parsed.getOpenapi()).isEqualTo("3.1.0");
            assertThat(parsed.getInfo().getTitle()).isEqualTo("pressmark");
            // two models at contract 1.0.0: the sum of their contract versions
            assertThat(parsed.getInfo().getVersion()).isEqualTo("2.0.0");
        }
        assertThat(ApiDocument.json(api)).startsWith("{").contains("\"openapi\" : \"3.1.0\"");
        assertThat(ApiDocument.yaml(api)).contains("openapi: 3.1.0");
    }

    @Test
    void each_model_s_labels_and_required_fields_come_back_through_the_parser() {
        OpenAPI parsed = parsedCleanly(ApiDocument.json(ApiDocument.build(new ServiceInfo("0.1.0", false), List.of(ROUTING, SPAM))));
        assertThat(enumOf(parsed, "Label_routing")).containsExactly("plumbing", "electrical", "garden");
        assertThat(enumOf(parsed, "Label_spam_filter")).containsExactly("ham", "spam");
        assertThat(schema(parsed, "Item_routing").getRequired()).containsExactly("title");
        assertThat(schema(parsed, "Item_spam_filter").getRequired()).containsExactlyInAnyOrder("subject", "sender");
        Schema<?> sender = schema(parsed, "Item_spam_filter").getProperties().get("sender");
        assertThat(sender.getTypes()).containsExactly("string");
        assertThat(schema(parsed, "Probabilities_routing").getRequired()).containsExactlyInAnyOrder("plumbing", "electrical", "garden");
        assertThat(parsed.getComponents().getSchemas()).doesNotContainKey("Probabilities_spam_filter");
        assertThat(schema(parsed, "Prediction_spam_filter").getRequired()).containsExactly("label", "score");

        Operation predict = parsed.getPaths().get("/models/spam-filter/predict").getPost();
        assertThat(predict.getOperationId()).isEqualTo("predict_spam_filter");
        assertThat(predict.getRequestBody().getContent().get("application/json").getSchema().get$ref())
                .isEqualTo("#/components/schemas/PredictRequest_spam_filter");
        Object example = predict.getRequestBody().getContent().get("application/json").getExamples().get("typical").getValue();
        assertThat(example.toString()).contains("win now").contains("prize");
        assertThat(parsed.getPaths()).containsKeys("/models/routing/predict", "/models/routing/explain",
                "/models/routing/versions/{tag}/predict", "/models/spam-filter/explain");
    }

    @Test
    void every_endpoint_of_the_service_is_there_with_an_operation_id_a_tag_and_a_summary() {
        OpenAPI parsed = parsedCleanly(ApiDocument.json(ApiDocument.build(new ServiceInfo("0.1.0", false), List.of())));
        // DESIGN.md's HTTP table, less the console at GET /
        Map<String, List<PathItem.HttpMethod>> table = Map.ofEntries(
                Map.entry("/health", List.of(PathItem.HttpMethod.GET)),
                Map.entry("/health/ready", List.of(PathItem.HttpMethod.GET)),
                Map.entry("/models", List.of(PathItem.HttpMethod.GET)),
                Map.entry("/models/{name}", List.of(PathItem.HttpMethod.GET)),
                Map.entry("/models/{name}/versions", List.of(PathItem.HttpMethod.GET)),
                Map.entry("/models/{name}/drift", List.of(PathItem.HttpMethod.GET)),
                Map.entry("/models/{name}/versions/{tag}", List.of(PathItem.HttpMethod.GET, PathItem.HttpMethod.PUT)),
                Map.entry("/models/{name}/predict", List.of(PathItem.HttpMethod.POST)),
                Map.entry("/models/{name}/versions/{tag}/predict", List.of(PathItem.HttpMethod.POST)),
                Map.entry("/models/{name}/explain", List.of(PathItem.HttpMethod.POST)),
                Map.entry("/models/{name}/active", List.of(PathItem.HttpMethod.PUT)),
                Map.entry("/models/{name}/rollback", List.of(PathItem.HttpMethod.POST)),
                Map.entry("/models/{name}/versions/{tag}/retire", List.of(PathItem.HttpMethod.POST)),
                Map.entry("/models/{name}/shadow", List.of(PathItem.HttpMethod.GET, PathItem.HttpMethod.PUT, PathItem.HttpMethod.DELETE)),
                Map.entry("/openapi.json", List.of(PathItem.HttpMethod.GET)),
                Map.entry("/openapi.yaml", List.of(PathItem.HttpMethod.GET)),
                Map.entry("/docs", List.of(PathItem.HttpMethod.GET)),
                Map.entry("/metrics", List.of(PathItem.HttpMethod.GET)));
        assertThat(parsed.getPaths().keySet()).containsExactlyInAnyOrderElementsOf(table.keySet());
        List<String> ids = new ArrayList<>();
        table.forEach((path, methods) -> {
            Map<PathItem.HttpMethod, Operation> operations = parsed.getPaths().get(path).readOperationsMap();
            assertThat(operations.keySet()).as(path).containsExactlyInAnyOrderElementsOf(methods);
            operations.values().forEach(op -> {
                assertThat(op.getOperationId()).as(path).isNotBlank();
                assertThat(op.getSummary()).as(path).isNotBlank();
                assertThat(op.getTags()).as(path).hasSize(1);
                ids.add(op.getOperationId());
            });
        });
        assertThat(ids).doesNotHaveDuplicates();
    }

    @Test
    void every_error_answer_is_a_problem_detail_with_rfc_9457_members() {
        OpenAPI parsed = parsedCleanly(ApiDocument.json(ApiDocument.build(new ServiceInfo("0.1.0", true), List.of(ROUTING))));
        // RFC 9457, section 3.1: the members of a problem detail object
        assertThat(schema(parsed, "Problem").getProperties())
                .containsKeys("type", "title", "status", "detail", "instance", "errors");
        assertThat(schema(parsed, "FieldError").getRequired()).containsExactly("field", "message");
        int errors = 0;
        for (PathItem item : parsed.getPaths().values()) {
            for (Operation op : item.readOperations()) {
                for (Map.Entry<String, ApiResponse> response : op.getResponses().entrySet()) {
                    int status = Integer.parseInt(response.getKey());
                    if (status < 400 || op.getOperationId().equals("getReadiness")) {
                        continue;
                    }
                    String ref = response.getValue().get$ref();
                    ApiResponse shared = parsed.getComponents().getResponses().get(ref.substring(ref.lastIndexOf('/') + 1));
                    assertThat(shared.getContent()).as(op.getOperationId() + " " + status).containsOnlyKeys("application/problem+json");
                    assertThat(shared.getContent().get("application/problem+json").getSchema().get$ref())
                            .isEqualTo("#/components/schemas/Problem");
                    errors++;
                }
            }
        }
        assertThat(errors).isGreaterThan(50);
    }

    @Test
    void admin_operations_always_need_the_bearer_token_and_reading_ones_only_with_a_reader_token() {
        for (boolean readerToken : List.of(false, true)) {
            OpenAPI parsed = parsedCleanly(ApiDocument.json(ApiDocument.build(new ServiceInfo("0.1.0", readerToken), List.of(ROUTING))));
            assertThat(parsed.getComponents().getSecuritySchemes().get("bearer").getScheme()).isEqualTo("bearer");
            assertThat(parsed.getComponents().getSecuritySchemes().get("bearer").getType().toString()).isEqualTo("http");
            List<Operation> admin = List.of(parsed.getPaths().get("/models/{name}/versions/{tag}").getPut(),
                    parsed.getPaths().get("/models/{name}/active").getPut(), parsed.getPaths().get("/models/{name}/rollback").getPost(),
                    parsed.getPaths().get("/models/{name}/versions/{tag}/retire").getPost());
            admin.forEach(op -> {
                assertThat(op.getSecurity()).as(op.getOperationId()).hasSize(1);
                assertThat(op.getSecurity().get(0)).containsOnlyKeys("bearer");
                assertThat(op.getResponses()).containsKeys("401", "403");
            });
            List<Operation> reading = List.of(parsed.getPaths().get("/models").getGet(),
                    parsed.getPaths().get("/models/routing/predict").getPost(), parsed.getPaths().get("/models/{name}/versions/{tag}").getGet());
            reading.forEach(op -> assertThat(op.getSecurity() != null && !op.getSecurity().isEmpty())
                    .as(op.getOperationId() + " with reader token " + readerToken).isEqualTo(readerToken));
            assertThat(parsed.getPaths().get("/health").getGet().getSecurity()).isNull();
            assertThat(schema(parsed, "RetireRequest").getRequired()).containsExactly("reason");
        }
    }

    private static ModelDescriptor atContract(ModelDescriptor model, String contractVersion) {
        return new ModelDescriptor(model.name(), model.activeTag(), model.labels(), model.inputFields(), model.probabilities(), model.examples(),
                contractVersion);
    }

    @Test
    void the_document_version_is_the_program_s_without_models_the_model_s_contract_with_one_and_their_sum_with_several() {
        ServiceInfo service = new ServiceInfo("0.1.0", false);
        assertThat(parsedCleanly(ApiDocument.json(ApiDocument.build(service, List.of()))).getInfo().getVersion()).isEqualTo("0.1.0");
        OpenAPI one = parsedCleanly(ApiDocument.json(ApiDocument.build(service, List.of(atContract(ROUTING, "3.1.0")))));
        assertThat(one.getInfo().getVersion()).isEqualTo("3.1.0");
        assertThat(one.getInfo().getDescription()).contains("routing 1.4.0 (contract 3.1.0)");
        OpenAPI two = parsedCleanly(ApiDocument.json(ApiDocument.build(service, List.of(atContract(ROUTING, "3.1.0"), atContract(SPAM, "2.4.1")))));
        assertThat(two.getInfo().getVersion()).isEqualTo("5.5.1");
    }

    @Test
    void publish_documents_the_signature_header_the_breaking_switch_and_the_signature_refusal() {
        OpenAPI parsed = parsedCleanly(ApiDocument.json(ApiDocument.build(new ServiceInfo("0.1.0", false), List.of(ROUTING))));
        Operation publish = parsed.getPaths().get("/models/{name}/versions/{tag}").getPut();
        assertThat(publish.getParameters()).anySatisfy(p -> {
            assertThat(p.getName()).isEqualTo("Pressmark-Signature");
            assertThat(p.getIn()).isEqualTo("header");
            assertThat(p.getDescription()).contains("base64url");
        });
        assertThat(publish.getParameters()).anySatisfy(p -> {
            assertThat(p.getName()).isEqualTo("allow_breaking");
            assertThat(p.getIn()).isEqualTo("query");
        });
        assertThat(publish.getResponses()).containsKeys("409", "422");
        assertThat(schema(parsed, "VersionDetail").getProperties()).containsKeys("contract_version", "contract", "signed_by");
    }

    @Test
    void the_bundle_upload_is_an_octet_stream() {
        OpenAPI parsed = parsedCleanly(ApiDocument.json(ApiDocument.build(new ServiceInfo("0.1.0", false), List.of())));
        assertThat(parsed.getPaths().get("/models/{name}/versions/{tag}").getPut().getRequestBody().getContent())
                .containsKey("application/octet-stream");
    }

    @Test
    void a_model_named_twice_is_refused_by_name() {
        assertThatThrownBy(() -> ApiDocument.build(new ServiceInfo("0.1.0", false), List.of(ROUTING, ROUTING)))
                .isInstanceOf(IllegalArgumentException.class).hasMessageContaining("routing came twice");
    }

    @Test
    void a_descriptor_names_its_bad_field_and_value() {
        assertThatThrownBy(() -> new ModelDescriptor("Routing", "1", List.of("a", "b"), List.of("t"), false, List.of()))
                .hasMessage("name must match [a-z0-9][a-z0-9-]{0,63}, was \"Routing\"");
        assertThatThrownBy(() -> new ModelDescriptor("r", "1", List.of("a", "a"), List.of("t"), false, List.of()))
                .hasMessage("labels must be >= 2 distinct values, was [a, a]");
        assertThatThrownBy(() -> new ModelDescriptor("r", "1", List.of("a", "b"), List.of("t"), false,
                List.of(new ModelExample(Map.of("t", "x"), "c", 0.0, Map.of()))))
                .hasMessageContaining("one predicted c");
    }
}
