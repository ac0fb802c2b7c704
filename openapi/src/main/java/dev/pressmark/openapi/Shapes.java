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
    static final String RETIRE_REQUEST = "RetireRequest";
    static final String PROMOTION_CHECK = "PromotionCheck";
    static final String PROMOTION_REFUSAL = "PromotionRefusal";
    static final String SHADOW_REQUEST = "ShadowRequest";
    static final String SHADOW_REPORT = "ShadowReport";
    static final String SCORE_DIFFERENCE = "ScoreDifference";
    static final String CONTRIBUTION = "Contribution";
    static final String ITEM = "Item";
    static final String PREDICT_REQUEST = "PredictRequest";
    static final String PREDICTION = "Prediction";
    static final String PREDICT_RESPONSE = "PredictResponse";
    static final String EXPLANATION = "Explanation";
    static final String EXPLAIN_RESPONSE = "ExplainResponse";
    static final String DRIFT_REPORT = "DriftReport";
    static final String DRIFT_UNKNOWN_RATE = "DriftUnknownRate";
    static final String DRIFT_LENGTH = "DriftLength";
    static final String TOKENS_PER_ITEM = "TokensPerItem";
    static final String LENGTH_SHIFT = "LengthShift";

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
                "errors", array("The bad parts of the request, when there were any.", ref(FIELD_ERROR)),
                "checks", array("The promotion checks that refused an activation (409 promotion-refused).", ref(PROMOTION_REFUSAL))));
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
        components.addSchemas(ACTIVATE_REQUEST, additionalProperties(object("The version to activate.", List.of("tag"),
                "tag", pattern(string("A published tag of the model."), TAG_PATTERN),
                "force", bool("Activate even when the promotion check refuses; needs a reason. Default false."),
                "reason", string("Why, for the events; required with force.")), false));
        JsonSchema retireReason = string("Why the version is retired, for the events: not blank, at most 1000 characters.");
        retireReason.setMinLength(1);
        retireReason.setMaxLength(1_000);
        components.addSchemas(RETIRE_REQUEST, additionalProperties(object("Why a version is retired.", List.of("reason"),
                "reason", retireReason), false));
        addRollout(components);
        components.addSchemas(CONTRIBUTION, object("How much one feature moved the predicted label's score.", List.of("feature", "contribution"),
                "feature", string("column:subword."),
                "contribution", number("Weight times feature value; positive speaks for the predicted label.")));
        addGenericPredictions(components);
        addDrift(components);
    }

    /** The drift window of a model's active version against its training profile. */
    private static void addDrift(Components components) {
        components.addSchemas(DRIFT_UNKNOWN_RATE, object("The share of tokens the model cannot use.", List.of("live", "training"),
                "live", nullable(number("In the drift window; null while it is empty.")),
                "training", number("In the training rows.")));
        components.addSchemas(TOKENS_PER_ITEM, object("Tokens per item over every text field: the mean and nearest-rank percentiles.",
                List.of("mean", "p10", "p50", "p90"),
                "mean", number(null), "p10", number(null), "p50", number(null), "p90", number(null)));
        components.addSchemas(LENGTH_SHIFT, object("Relative shifts, (live - training) / max(training, 1): +0.5 is half as long again.",
                List.of("mean", "p50", "p90"),
                "mean", number(null), "p50", number(null), "p90", number(null)));
        components.addSchemas(DRIFT_LENGTH, object("Tokens per item, live against training.", List.of("live", "training", "shift"),
                "live", ref(TOKENS_PER_ITEM),
                "training", ref(TOKENS_PER_ITEM),
                "shift", ref(LENGTH_SHIFT)));
        components.addSchemas(DRIFT_REPORT, object("The last live items of the active version against its training rows; "
                        + "the live statistics are null while the window is empty.",
                List.of("model", "version", "window_items", "unknown_rate", "psi", "length", "status"),
                "model", string("The model's name."),
                "version", string("The tag of the version whose traffic the window holds."),
                "window_items", integer("How many live items the window holds.", 0),
                "unknown_rate", ref(DRIFT_UNKNOWN_RATE),
                "psi", nullable(number("Population stability index of the live items' token document frequencies against the training rows'.")),
                "length", nullable(ref(DRIFT_LENGTH)),
                "status", nullable(stringEnum("By the common rule of thumb: psi below 0.1 ok, 0.1 to 0.25 watch, above 0.25 drift.",
                        List.of("ok", "watch", "drift")))));
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
                "search", typed("object", "The model search that chose its settings, when there was one: metric, pick, candidates"
                        + " (settings and cross-validated mean and std_err) and the chosen candidate's index."),
                "contract_version", contractVersion(),
                "contract", nullable(ref(CONTRACT)),
                "signed_by", nullable(string("The id of the key that signed it; null when published unsigned."))));
        if (withServing) {
            required.add("serving");
            properties.add("serving");
            properties.add(nullable(string("The tag this server serves after loading; null when it could not load one.")));
            properties.add("promotion_check");
            properties.add(ref(PROMOTION_CHECK));
        }
        return object(description, required, properties.toArray());
    }

    /** Shadow scoring and the promotion check. */
    private static void addRollout(Components components) {
        components.addSchemas(PROMOTION_REFUSAL, object("One check that refused a candidate.",
                List.of("kind", "metric", "source", "active", "candidate", "limit", "message"),
                "kind", stringEnum("Which check.", List.of("metric-drop", "metric-missing", "shadow-agreement")),
                "metric", string("The manifest metric compared, or agreement."),
                "source", stringEnum("Where the values come from: the held-out test split, the cross-validation mean, or the shadow report.",
                        List.of("test", "cv", "shadow")),
                "active", nullable(number("The active version's value.")),
                "candidate", nullable(number("The candidate's value (its shadow agreement for shadow-agreement).")),
                "limit", number("The allowed drop, or the least agreement."),
                "message", string("The refusal in words.")));
        components.addSchemas(PROMOTION_CHECK, object("What the promotion check found for an activation.", List.of("passed", "checks", "notes"),
                "passed", bool("Whether every check passed."),
                "forced", bool("Whether the activation was forced past a refusal."),
                "checks", array("The checks that refused.", ref(PROMOTION_REFUSAL)),
                "notes", array("What could not be compared, and why.", string(null))));
        JsonSchema fraction = number("The share of requests scored by the candidate, in (0, 1]; default 0.2.");
        fraction.setExclusiveMinimumValue(java.math.BigDecimal.ZERO);
        fraction.setMaximum(java.math.BigDecimal.ONE);
        components.addSchemas(SHADOW_REQUEST, additionalProperties(object("The candidate to score beside the active version.", List.of("tag"),
                "tag", pattern(string("A published tag of the model, not the active one."), TAG_PATTERN),
                "fraction", fraction), false));
        components.addSchemas(SCORE_DIFFERENCE, object("Candidate minus active, per item: the probability of the active version's label when"
                        + " both give probabilities, else the winning score. Quantiles are of |difference|, as bin edges at or above the true value.",
                List.of("basis", "count", "sum", "mean", "max_abs", "p50", "p90", "p99", "bounds", "counts"),
                "basis", stringEnum("What is compared.", List.of("probability", "score", "mixed")),
                "count", integer("Items.", 0),
                "sum", number("Sum of the differences."),
                "mean", nullable(number("Mean difference; null before any item.")),
                "max_abs", number("Largest |difference|."),
                "p50", nullable(number("Upper bound of the median |difference|.")),
                "p90", nullable(number("Upper bound of the 90th percentile of |difference|.")),
                "p99", nullable(number("Upper bound of the 99th percentile of |difference|.")),
                "bounds", array("Upper edges of the bins of |difference|.", number(null)),
                "counts", array("Items per bin; one more than bounds, the last above the last edge.", integer(null, 0))));
        components.addSchemas(SHADOW_REPORT, object("A model's newest shadow run, every replica's report summed.",
                List.of("model", "active", "candidate", "running", "fraction", "started_at", "replicas", "samples", "dropped", "agreeing",
                        "agreement", "labels", "score_difference"),
                "model", string("The model's name."),
                "active", string("The active version the candidate was compared with."),
                "candidate", string("The candidate's tag."),
                "running", bool("Whether the run goes on; false once stopped, promoted or replaced."),
                "fraction", nullable(number("The share of requests sampled; null once stopped.")),
                "started_at", format(string("When the run started."), "date-time"),
                "replicas", integer("How many servers reported.", 0),
                "samples", integer("Items the candidate scored.", 0),
                "dropped", integer("Items of sampled requests never scored because the queue was full.", 0),
                "agreeing", integer("Items on which both gave the same label.", 0),
                "agreement", nullable(number("agreeing / samples; null before any item.")),
                "labels", map("Active label to candidate label to items.", map(null, integer(null, 0))),
                "score_difference", ref(SCORE_DIFFERENCE)));
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
