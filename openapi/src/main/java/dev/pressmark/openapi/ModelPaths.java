package dev.pressmark.openapi;

import static dev.pressmark.openapi.Ops.json;
import static dev.pressmark.openapi.Ops.operation;
import static dev.pressmark.openapi.Ops.problems;
import static dev.pressmark.openapi.Schemas.additionalProperties;
import static dev.pressmark.openapi.Schemas.array;
import static dev.pressmark.openapi.Schemas.integer;
import static dev.pressmark.openapi.Schemas.number;
import static dev.pressmark.openapi.Schemas.object;
import static dev.pressmark.openapi.Schemas.ref;
import static dev.pressmark.openapi.Schemas.string;
import static dev.pressmark.openapi.Schemas.stringEnum;

import io.swagger.v3.oas.models.Components;
import io.swagger.v3.oas.models.Operation;
import io.swagger.v3.oas.models.PathItem;
import io.swagger.v3.oas.models.Paths;
import io.swagger.v3.oas.models.examples.Example;
import io.swagger.v3.oas.models.media.JsonSchema;
import io.swagger.v3.oas.models.media.MediaType;
import io.swagger.v3.oas.models.parameters.RequestBody;
import io.swagger.v3.oas.models.responses.ApiResponse;
import io.swagger.v3.oas.models.tags.Tag;
import java.math.BigDecimal;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * One served model's own paths and schemas: predict and explain whose items name the model's
 * input fields and whose answers name its labels. Component names end in the model's name
 * with hyphens as underscores ({@code PredictRequest_spam_filter}): model names never hold an
 * underscore, so distinct models give distinct names, and each is a valid component key.
 */
final class ModelPaths {

    static final String EXAMPLE = "typical";

    private final ModelDescriptor model;
    private final boolean readerToken;
    private final String suffix;

    ModelPaths(ModelDescriptor model, boolean readerToken) {
        this.model = model;
        this.readerToken = readerToken;
        this.suffix = suffix(model.name());
    }

    static String suffix(String modelName) {
        return "_" + modelName.replace('-', '_');
    }

    static String tagName(String modelName) {
        return "model-" + modelName;
    }

    String component(String base) {
        return base + suffix;
    }

    Tag tag() {
        Tag tag = new Tag();
        tag.setName(tagName(model.name()));
        tag.setDescription("Model " + model.name() + ", version " + model.activeTag() + ": labels " + String.join(", ", model.labels())
                + "; input fields " + String.join(", ", model.inputFields()) + ".");
        return tag;
    }

    void addTo(Components components, Paths paths) {
        addSchemas(components);
        String base = "/models/" + model.name();
        ServicePaths service = new ServicePaths(readerToken);

        Operation predict = service.reading(operation("predict" + suffix, tagName(model.name()), "Predict with " + model.name(),
                "Classifies each item with version " + model.activeTag() + " of " + model.name() + ", the active one."));
        predict.setRequestBody(body());
        ApiResponse predicted = json("One prediction per item, in order.", ref(component(Shapes.PREDICT_RESPONSE)));
        exampleOf(predicted.getContent().get(Ops.JSON), responseExample());
        predict.getResponses().addApiResponse("200", predicted);
        problems(predict, 400, 404, 413, 415, 500, 503);
        paths.addPathItem(base + "/predict", new PathItem().post(predict));

        Operation explain = service.reading(operation("explain" + suffix, tagName(model.name()), "Explain predictions of " + model.name(),
                "Each item's prediction by version " + model.activeTag() + " with the k subword features that moved its score most."));
        explain.setRequestBody(body());
        explain.addParametersItem(ServicePaths.k());
        explain.getResponses().addApiResponse("200", json("One explanation per item, in order.", ref(component(Shapes.EXPLAIN_RESPONSE))));
        problems(explain, 400, 404, 413, 415, 500, 503);
        paths.addPathItem(base + "/explain", new PathItem().post(explain));

        // Another version may predict other labels, so its answer is typed as any model's.
        Operation named = service.reading(operation("predictVersion" + suffix, tagName(model.name()),
                "Predict with a named version of " + model.name(),
                "Items as for version " + model.activeTag() + "; a version with other input fields needs those instead. "
                        + "The answer names that version's labels, which may differ from the active version's."));
        named.setRequestBody(body());
        named.getResponses().addApiResponse("200", json("One prediction per item, in order.", ref(Shapes.PREDICT_RESPONSE)));
        problems(named, 400, 404, 409, 413, 415, 500, 503);
        paths.addPathItem(base + "/versions/{tag}/predict", new PathItem().post(named)
                .parameters(new ArrayList<>(List.of(ServicePaths.tag()))));
    }

    private void addSchemas(Components components) {
        List<Object> fields = new ArrayList<>();
        for (String field : model.inputFields()) {
            fields.add(field);
            fields.add(string("The " + field + " text."));
        }
        components.addSchemas(component(Shapes.ITEM), object("One item for " + model.name() + ": every input field as a string.",
                model.inputFields(), fields.toArray()));
        components.addSchemas(component(Shapes.PREDICT_REQUEST), additionalProperties(object("Items for " + model.name() + ".",
                List.of("items"), "items", array("The items to classify.", ref(component(Shapes.ITEM)))), false));
        components.addSchemas(component("Label"), stringEnum("A label of " + model.name() + " " + model.activeTag() + ".", model.labels()));

        List<String> predictionRequired = new ArrayList<>(List.of("label", "score"));
        List<Object> prediction = new ArrayList<>(List.of(
                "label", ref(component("Label")),
                "score", number("The predicted label's decision value."),
                "truncated_tokens", integer("Present when a field was longer than the server scores: how many of its tokens were cut off the end.", 1)));
        if (model.probabilities()) {
            List<Object> perLabel = new ArrayList<>();
            for (String label : model.labels()) {
                perLabel.add(label);
                perLabel.add(probability());
            }
            components.addSchemas(component("Probabilities"), additionalProperties(object("Each label's probability; they sum to 1.",
                    model.labels(), perLabel.toArray()), false));
            predictionRequired.add("probabilities");
            prediction.add("probabilities");
            prediction.add(ref(component("Probabilities")));
        }
        components.addSchemas(component(Shapes.PREDICTION), object("One item's prediction.", predictionRequired, prediction.toArray()));
        components.addSchemas(component(Shapes.PREDICT_RESPONSE), object("Predictions of " + model.name() + ", in item order.",
                List.of("model", "version", "results"),
                "model", stringEnum("The model's name.", List.of(model.name())),
                "version", string("The tag of the version that predicted."),
                "results", array("One per item, in order.", ref(component(Shapes.PREDICTION)))));

        List<String> explanationRequired = new ArrayList<>(predictionRequired);
        explanationRequired.addAll(List.of("intercept", "contributions", "features_used", "unknown_tokens"));
        List<Object> explanation = new ArrayList<>(prediction);
        explanation.addAll(List.of(
                "intercept", number("The score's intercept."),
                "contributions", array("Largest magnitude first.", ref(Shapes.CONTRIBUTION)),
                "features_used", integer("How many features the item had.", 0),
                "unknown_tokens", integer("How many of its subwords the model could not use.", 0)));
        components.addSchemas(component(Shapes.EXPLANATION), object("One item's prediction and the features that moved it most.",
                explanationRequired, explanation.toArray()));
        components.addSchemas(component(Shapes.EXPLAIN_RESPONSE), object("Explanations of " + model.name() + ", in item order.",
                List.of("model", "version", "results"),
                "model", stringEnum("The model's name.", List.of(model.name())),
                "version", string("The tag of the version that predicted."),
                "results", array("One per item, in order.", ref(component(Shapes.EXPLANATION)))));
    }

    private static JsonSchema probability() {
        JsonSchema p = number(null);
        p.setMinimum(BigDecimal.ZERO);
        p.setMaximum(BigDecimal.ONE);
        return p;
    }

    private RequestBody body() {
        RequestBody body = ServicePaths.jsonBody(component(Shapes.PREDICT_REQUEST));
        exampleOf(body.getContent().get(Ops.JSON), requestExample());
        return body;
    }

    private void exampleOf(MediaType media, Map<String, Object> value) {
        if (model.examples().isEmpty()) {
            return;
        }
        Example example = new Example();
        example.setSummary("Items made of the words weighted most towards " + String.join(", ",
                model.labels().subList(0, model.examples().size())));
        example.setValue(value);
        media.addExamples(EXAMPLE, example);
    }

    private Map<String, Object> requestExample() {
        List<Object> items = new ArrayList<>();
        for (ModelExample example : model.examples()) {
            items.add(new LinkedHashMap<>(ordered(example.item())));
        }
        Map<String, Object> value = new LinkedHashMap<>();
        value.put("items", items);
        return value;
    }

    private Map<String, Object> responseExample() {
        List<Object> results = new ArrayList<>();
        for (ModelExample example : model.examples()) {
            Map<String, Object> result = new LinkedHashMap<>();
            result.put("label", example.label());
            result.put("score", example.score());
            if (model.probabilities()) {
                Map<String, Object> probabilities = new LinkedHashMap<>();
                for (String label : model.labels()) {
                    probabilities.put(label, example.probabilities().get(label));
                }
                result.put("probabilities", probabilities);
            }
            results.add(result);
        }
        Map<String, Object> value = new LinkedHashMap<>();
        value.put("model", model.name());
        value.put("version", model.activeTag());
        value.put("results", results);
        return value;
    }

    /** The item's fields in the model's order, so that the example reads as the schema does. */
    private Map<String, String> ordered(Map<String, String> item) {
        Map<String, String> fields = new LinkedHashMap<>();
        for (String field : model.inputFields()) {
            fields.put(field, item.get(field));
        }
        return fields;
    }
}
