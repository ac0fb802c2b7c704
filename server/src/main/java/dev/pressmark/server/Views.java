package dev.pressmark.server;

import com.fasterxml.jackson.core.JsonGenerator;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.MissingNode;
import com.fasterxml.jackson.databind.node.NullNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import dev.pressmark.core.bundle.Contribution;
import dev.pressmark.core.bundle.Explanation;
import dev.pressmark.core.bundle.Manifest;
import dev.pressmark.core.bundle.Prediction;
import dev.pressmark.core.contract.ContractRecord;
import dev.pressmark.core.drift.DriftReport;
import dev.pressmark.core.drift.LengthShift;
import dev.pressmark.core.drift.LengthSummary;
import dev.pressmark.core.sign.BundleSignature;
import dev.pressmark.store.Version;
import dev.pressmark.store.lifecycle.PromotionCheck;
import dev.pressmark.store.lifecycle.ShadowStatus;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.util.List;
import java.util.Map;

/** The JSON shapes of the responses. */
public final class Views {

    private final ObjectMapper json;

    Views(ObjectMapper json) {
        this.json = json;
    }

    ObjectNode object() {
        return json.createObjectNode();
    }

    /** A version's summary, as the versions endpoints answer it. */
    ObjectNode versionSummary(Version v) {
        return putSummary(json.createObjectNode(), v);
    }

    /** Puts a version's summary fields into {@code node}: the shape {@code pressmark versions --json} starts from too. */
    public static ObjectNode putSummary(ObjectNode node, Version v) {
        return node
                .put("tag", v.tag())
                .put("sha256", v.sha256())
                .put("size", v.sizeBytes())
                .put("created_at", v.createdAt().toString())
                .put("active", v.active())
                .put("retired", v.retired())
                .put("contract_version", v.contract().map(c -> c.version().toString()).orElse(null));
    }

    /**
     * A shadow run's status, as {@code GET /models/{name}/shadow} and {@code pressmark shadow-report --json}
     * answer it: {@code model}, {@code active}, {@code candidate}, {@code running}, {@code fraction},
     * {@code started_at}, {@code replicas}, then the summary's other members.
     */
    public static ObjectNode shadowStatus(ShadowStatus status) {
        ObjectNode body = status.summary().toJson();
        ObjectNode node = body.objectNode();
        node.put("model", status.model());
        node.put("active", status.summary().active());
        node.put("candidate", status.candidate());
        node.put("running", status.running().isPresent());
        if (status.running().isPresent()) {
            node.put("fraction", status.running().get().fraction());
        } else {
            node.putNull("fraction");
        }
        node.put("started_at", status.startedAt().toString());
        node.put("replicas", status.replicas());
        body.remove("active");
        body.remove("candidate");
        node.setAll(body);
        return node;
    }

    /** A version's contract record as the store keeps it, or null when it kept none. */
    static JsonNode contract(Version v) {
        return v.contract().<JsonNode>map(ContractRecord::toJsonNode).orElse(NullNode.getInstance());
    }

    /** The id of the key that signed a version, or null. */
    static String signedBy(Version v) {
        return v.signatureJson().map(json -> BundleSignature.parse(json, v.model() + " " + v.tag() + " signature").keyId()).orElse(null);
    }

    ObjectNode versions(String model, List<Version> versions) {
        ObjectNode root = json.createObjectNode().put("model", model);
        ArrayNode list = root.putArray("versions");
        versions.forEach(v -> list.add(versionSummary(v)));
        return root;
    }

    /** A model's drift window against its training profile; the live statistics are null while the window is empty. */
    ObjectNode drift(String model, String version, DriftReport report) {
        ObjectNode node = json.createObjectNode().put("model", model).put("version", version).put("window_items", report.windowItems());
        node.putObject("unknown_rate").put("live", report.liveUnknownRate()).put("training", report.trainingUnknownRate());
        node.put("psi", report.psi());
        LengthShift length = report.length();
        if (length == null) {
            node.putNull("length");
        } else {
            ObjectNode lengths = node.putObject("length");
            lengths.set("live", lengths(length.live()));
            lengths.set("training", lengths(length.training()));
            lengths.putObject("shift").put("mean", length.mean()).put("p50", length.p50()).put("p90", length.p90());
        }
        node.put("status", report.status() == null ? null : report.status().key());
        return node;
    }

    private ObjectNode lengths(LengthSummary summary) {
        return json.createObjectNode().put("mean", summary.mean()).put("p10", summary.p10()).put("p50", summary.p50()).put("p90", summary.p90());
    }

    /** One version's metadata: the summary plus what its manifest says about it. */
    ObjectNode versionDetail(Version v) {
        Manifest manifest = manifest(v);
        ObjectNode node = json.createObjectNode().put("model", v.model());
        node.setAll(versionSummary(v));
        // a part the manifest lacks (an archive that is not a model) answers null, as it always has
        node.set("labels", manifest.labels().isEmpty() ? MissingNode.getInstance() : strings(manifest.labels()));
        node.set("input_fields", manifest.inputFields().isEmpty() ? MissingNode.getInstance() : strings(manifest.inputFields()));
        node.set("metrics", manifest.metrics().<JsonNode>map(Manifest.Metrics::toJson).orElse(MissingNode.getInstance()));
        node.set("provenance", manifest.provenance().<JsonNode>map(Manifest.Provenance::toJson).orElse(MissingNode.getInstance()));
        manifest.searchJson().ifPresent(search -> node.set("search", search));
        node.set("contract", contract(v));
        node.put("signed_by", signedBy(v));
        return node;
    }

    private ArrayNode strings(List<String> values) {
        ArrayNode array = json.createArrayNode();
        values.forEach(array::add);
        return array;
    }

    /** What the promotion check found: {@code passed}, each refusal as {@code checks}, and {@code notes}. */
    ObjectNode promotion(PromotionCheck.Outcome outcome) {
        ObjectNode node = json.createObjectNode().put("passed", outcome.passed());
        ArrayNode checks = node.putArray("checks");
        for (PromotionCheck.Refusal r : outcome.refusals()) {
            ObjectNode check = checks.addObject().put("kind", r.kind()).put("metric", r.metric()).put("source", r.source());
            number(check, "active", r.active());
            number(check, "candidate", r.candidate());
            check.put("limit", r.limit());
            check.put("message", r.message());
        }
        ArrayNode notes = node.putArray("notes");
        outcome.notes().forEach(notes::add);
        return node;
    }

    private static void number(ObjectNode node, String field, double value) {
        if (Double.isNaN(value)) {
            node.putNull(field);
        } else {
            node.put(field, value);
        }
    }

    /** One result's members, written into the result object the caller opened. */
    @FunctionalInterface
    private interface ResultWriter<T> {
        void write(JsonGenerator g, T result) throws IOException;
    }

    /**
     * The predict answer as UTF-8 JSON bytes, written straight through a generator: it is the
     * hottest response, and building a tree first costs more than the model itself.
     */
    byte[] predictions(String model, LiveVersion served, List<Prediction> predictions) {
        return results(model, served, predictions, Views::writePrediction);
    }

    /** The explain answer: each prediction's members, then the contributions that moved it. */
    byte[] explanations(String model, LiveVersion served, List<Explanation> explanations) {
        return results(model, served, explanations, (g, e) -> {
            writePrediction(g, e.prediction());
            g.writeNumberField("intercept", e.intercept());
            g.writeArrayFieldStart("contributions");
            for (Contribution c : e.contributions()) {
                g.writeStartObject();
                g.writeStringField("feature", c.feature());
                g.writeNumberField("contribution", c.contribution());
                g.writeEndObject();
            }
            g.writeEndArray();
            g.writeNumberField("features_used", e.featuresUsed());
            g.writeNumberField("unknown_tokens", e.prediction().unknownTokens());
        });
    }

    /** {@code {"model", "version", "results": [...]}} with one object per result. */
    private <T> byte[] results(String model, LiveVersion served, List<T> results, ResultWriter<T> writer) {
        ByteArrayOutputStream out = new ByteArrayOutputStream(64 + 160 * results.size());
        try (JsonGenerator g = json.getFactory().createGenerator(out)) {
            g.writeStartObject();
            g.writeStringField("model", model);
            g.writeStringField("version", served.tag());
            g.writeArrayFieldStart("results");
            for (T result : results) {
                g.writeStartObject();
                writer.write(g, result);
                g.writeEndObject();
            }
            g.writeEndArray();
            g.writeEndObject();
        } catch (IOException e) {
            throw new UncheckedIOException("writing an answer to memory failed", e);
        }
        return out.toByteArray();
    }

    private static void writePrediction(JsonGenerator g, Prediction p) throws IOException {
        g.writeStringField("label", p.label());
        g.writeNumberField("score", p.score());
        if (p.truncatedTokens() > 0) {
            g.writeNumberField("truncated_tokens", p.truncatedTokens());
        }
        if (p.probabilities() != null) {
            g.writeObjectFieldStart("probabilities");
            for (Map.Entry<String, Double> e : p.probabilities().entrySet()) {
                g.writeNumberField(e.getKey(), e.getValue());
            }
            g.writeEndObject();
        }
    }

    private static Manifest manifest(Version v) {
        try {
            return Manifest.parse(v.manifestJson());
        } catch (IllegalArgumentException e) {
            throw new IllegalStateException("the stored manifest of " + v.model() + " " + v.tag() + " is not a manifest: " + e.getMessage(), e);
        }
    }
}
