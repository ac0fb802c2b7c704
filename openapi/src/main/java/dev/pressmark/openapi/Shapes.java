package dev.pressmark.openapi;

import static dev.pressmark.openapi.Schemas.additionalProperties;
import static dev.pressmark.openapi.Schemas.array;
import static dev.pressmark.openapi.Schemas.bool;
import static dev.pressmark.openapi.Schemas.format;
import static dev.pressmark.openapi.Schemas.integer;
import static dev.pressmark.openapi.Schemas.map;
import static dev.pressmark.openapi.Schemas.nullable;
import static dev.pressmark.openapi.Schemas.number;
import static dev.pressmark.openapi.Schemas.object;
import static dev.pressmark.openapi.Schemas.pattern;
import static dev.pressmark.openapi.Schemas.ref;
import static dev.pressmark.openapi.Schemas.string;
import static dev.pressmark.openapi.Schemas.stringEnum;
import static dev.pressmark.openapi.Schemas.typed;

import io.swagger.v3.oas.models.Components;
import io.swagger.v3.oas.models.media.JsonSchema;
import java.util.ArrayList;
import java.util.List;

/** The schemas every document has: the shapes of the model-independent requests and answers. */
final class Shapes {

    static final String PROBLEM = "Problem";
    static final String FIELD_ERROR = "FieldError";
    static final String HEALTH = "Health";
    static final String READINESS = "Readiness";
    static final String READINESS_MODEL = "ReadinessModel";
    static final String MODEL_LIST = "ModelList";
    static final String MODEL_ENTRY = "ModelEntry";
    static final String VERSION_SUMMARY = "VersionSummary";
    static final String VERSION_DETAIL = "VersionDetail";
    static final String VERSION_LIST = "VersionList";
    static final String CONTRACT = "Contract";
    static final String ACTIVATE_REQUEST = "ActivateRequest";
    static final String ACTIVATION = "Activation";
    static final String CONTRIBUTION = "Contribution";
    static final String ITEM = "Item";
    static final String PREDICT_REQUEST = "PredictRequest";
    static final String PREDICTION = "Prediction";
    static final String PREDICT_RESPONSE = "PredictResponse";
    static final String EXPLANATION = "Explanation";
    static final String EXPLAIN_RESPONSE = "ExplainResponse";

    /** The store's rules for names and tags (DESIGN.md). */
    static final String NAME_PATTERN = "^[a-z0-9][a-z0-9-]{0,63}$";
    static final String TAG_PATTERN = "^[A-Za-z0-9][A-Za-z0-9._-]{0,63}$";

    private Shapes() {
    }

    static void addTo(Components components) {
        // RFC 9457, section 3.1: type, title, status, detail and instance; "errors" is our extension member.
        components.addSchemas(PROBLEM, object("A problem detail (RFC 9457).", List.of("type", "title", "status", "detail", "instance"),
                "type", format(string("A URN naming the kind of problem, urn:pressmark:problem:<slug>."), "uri"),
                "title", string("A short summary of the kind of problem."),
                "status", integer("The HTTP status code.", 100),
                "detail", string("What went wrong with this request."),
                "instance", format(string("The path of the request."), "uri-reference"),
                "errors", array("The bad parts of the request, when there were any.", ref(FIELD_ERROR))));
        components.addSchemas(FIELD_ERROR, object("One bad part of a request.", List.of("field", "message"),
                "field", string("A JSON path such as items[2].title, a query or path parameter, or a header."),
                "message", string("What is wrong with it.")));
        components.addSchemas(HEALTH, object("Liveness.", List.of("status"), "status", stringEnum("Always up.", List.of("up"))));
        components.addSchemas(READINESS_MODEL, object("One model's state in the readiness report.", List.of(),
                "active", string("The store's active tag."),
                "serving", string("The tag this server serves."),
                "failed_tag", string("A tag that failed to load."),
                "error", string("Why it failed.")));
        components.addSchemas(READINESS, object("Readiness: the store answers and every active model is loaded.",
                List.of("status", "store", "models"),
                "status", stringEnum("ready or not-ready.", List.of("ready", "not-ready")),
                "store", string("up, or down: and the reason."),
                "models", map("Each model with an active version, by name.", ref(READINESS_MODEL))));
        components.addSchemas(VERSION_SUMMARY, object("A stored version.", List.of("tag", "sha256", "size", "created_at", "active", "retired"),
                "tag", pattern(string("The immutable version tag."), TAG_PATTERN),
                "sha256", pattern(string("SHA-256 of the bundle file, lower-case hex."), "^[0-9a-f]{64}$"),
                "size", format(integer("The bundle file's size in bytes.", 0), "int64"),
                "created_at", format(string("When it was published."), "date-time"),
                "active", bool("Whether it is the model's active version."),
                "retired", bool("Whether it was retired."),
                "contract_version", contractVersion()));
        components.addSchemas(CONTRACT, object("The version's contract record, made at publish.", List.of("version", "against", "diff"),
                "version", contractVersion(),
                "against", nullable(string("The version that was active at publish; null for the first.")),
                "diff", object("How its input fields and labels differ from that version's.",
                        List.of("added_fields", "removed_fields", "added_labels", "removed_labels", "breaking"),
                        "added_fields", array("Input fields it added (breaking: predict requires every field).", string(null)),
                        "removed_fields", array("Input fields it removed (breaking).", string(null)),
                        "added_labels", array("Labels it added.", string(null)),
                        "removed_labels", array("Labels it removed (breaking).", string(null)),
                        "breaking", bool("Whether clients of that version can break."))));
        components.addSchemas(VERSION_DETAIL, versionDetail("A stored version with what its manifest says.", false));
        components.addSchemas(ACTIVATION, versionDetail("The version now active, and the one this server serves.", true));
        components.addSchemas(VERSION_LIST, object("A model's versions, newest first.", List.of("model", "versions"),
                "model", string("The model's name."),
                "versions", array("Newest first.", ref(VERSION_SUMMARY))));
        components.addSchemas(MODEL_ENTRY, object("A model in the store.", List.of("name", "versions", "active"),
                "name", string("The model's name."),
                "versions", integer("How many versions it has.", 0),
                "active", nullable(ref(VERSION_SUMMARY))));
        components.addSchemas(MODEL_LIST, object("Every model in the store, by name.", List.of("models"),
                "models", array("By name.", ref(MODEL_ENTRY))));
        components.addSchemas(ACTIVATE_REQUEST, object("The version to activate.", List.of("tag"),
                "tag", pattern(string("A published tag of the model."), TAG_PATTERN)));
        components.addSchemas(CONTRIBUTION, object("How much one feature moved the predicted label's score.", List.of("feature", "contribution"),
                "feature", string("column:subword."),
                "contribution", number("Weight times feature value; positive speaks for the predicted label.")));
        addGenericPredictions(components);
    }

    private static JsonSchema contractVersion() {
        return nullable(pattern(string("The semantic version of its HTTP contract (input fields and labels); null for versions published"
                + " before the store kept it."), "^[0-9]+\\.[0-9]+\\.[0-9]+$"));
    }

    private static JsonSchema versionDetail(String description, boolean withServing) {
        List<String> required = new ArrayList<>(List.of("model", "tag", "sha256", "size", "created_at", "active", "retired", "labels",
                "input_fields", "metrics", "provenance"));
        List<Object> properties = new ArrayList<>(List.of(
                "model", string("The model's name."),
                "tag", pattern(string("The immutable version tag."), TAG_PATTERN),
                "sha256", pattern(string("SHA-256 of the bundle file, lower-case hex."), "^[0-9a-f]{64}$"),
                "size", format(integer("The bundle file's size in bytes.", 0), "int64"),
                "created_at", format(string("When it was published."), "date-time"),
                "active", bool("Whether it is the model's active version."),
                "retired", bool("Whether it was retired."),
                "labels", array("The labels it predicts.", string(null)),
                "input_fields", array("The text fields every item must carry.", string(null)),
                "metrics", typed("object", "Cross-validation and held-out test metrics, as the manifest records them."),
                "provenance", typed("object", "How it was made: library, Java, OS, seed, data checksum, config."),
                "contract_version", contractVersion(),
                "contract", nullable(ref(CONTRACT)),
                "signed_by", nullable(string("The id of the key that signed it; null when published unsigned."))));
        if (withServing) {
            required.add("serving");
            properties.add("serving");
            properties.add(nullable(string("The tag this server serves after loading; null when it could not load one.")));
        }
        return object(description, required, properties.toArray());
    }

    /** The shapes of predict and explain for any model: the fields and labels are the model's, so here only strings. */
    private static void addGenericPredictions(Components components) {
        components.addSchemas(ITEM, map("Every input field of the model mapped to its text (GET /models/{name} lists them).",
                string(null)));
        components.addSchemas(PREDICT_REQUEST, additionalProperties(object("Items to classify.", List.of("items"),
                "items", array("The items, each with every input field.", ref(ITEM))), false));
        components.addSchemas(PREDICTION, object("One item's prediction.", List.of("label", "score"),
                "label", string("The predicted label."),
                "score", number("The predicted label's decision value."),
                "probabilities", map("Each label's probability, when the model gives them.", number(null)),
                "truncated_tokens", integer("Present when a field was longer than the server scores: how many of its tokens were cut off the end.", 1)));
        components.addSchemas(PREDICT_RESPONSE, object("Predictions, in item order, with the version that made them.",
                List.of("model", "version", "results"),
                "model", string("The model's name."),
                "version", string("The tag of the version that predicted."),
                "results", array("One per item, in order.", ref(PREDICTION))));
        components.addSchemas(EXPLANATION, object("One item's prediction and the features that moved it most.",
                List.of("label", "score", "intercept", "contributions", "features_used", "unknown_tokens"),
                "label", string("The predicted label."),
                "score", number("The predicted label's decision value."),
                "probabilities", map("Each label's probability, when the model gives them.", number(null)),
                "intercept", number("The score's intercept."),
                "contributions", array("Largest magnitude first.", ref(CONTRIBUTION)),
                "features_used", integer("How many features the item had.", 0),
                "unknown_tokens", integer("How many of its subwords the model could not use.", 0),
                "truncated_tokens", integer("Present when a field was longer than the server scores: how many of its tokens were cut off the end.", 1)));
        components.addSchemas(EXPLAIN_RESPONSE, object("Explanations, in item order, with the version that made them.",
                List.of("model", "version", "results"),
                "model", string("The model's name."),
                "version", string("The tag of the version that predicted."),
                "results", array("One per item, in order.", ref(EXPLANATION))));
    }
}
