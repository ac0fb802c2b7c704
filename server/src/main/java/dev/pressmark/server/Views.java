package dev.pressmark.server;

import com.fasterxml.jackson.core.JsonGenerator;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import dev.pressmark.core.bundle.Contribution;
import dev.pressmark.core.bundle.Explanation;
import dev.pressmark.core.bundle.Prediction;
import dev.pressmark.store.Version;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.util.List;
import java.util.Map;

/** The JSON shapes of the responses. */
final class Views {

    private final ObjectMapper json;

    Views(ObjectMapper json) {
        this.json = json;
    }

    ObjectNode object() {
        return json.createObjectNode();
    }

    /** A version as {@code pressmark versions --json} lists it. */
    ObjectNode versionSummary(Version v) {
        return json.createObjectNode()
                .put("tag", v.tag())
                .put("sha256", v.sha256())
                .put("size", v.sizeBytes())
                .put("created_at", v.createdAt().toString())
                .put("active", v.active())
                .put("retired", v.retired());
    }

    ObjectNode versions(String model, List<Version> versions) {
        ObjectNode root = json.createObjectNode().put("model", model);
        ArrayNode list = root.putArray("versions");
        versions.forEach(v -> list.add(versionSummary(v)));
        return root;
    }

    /** One version's metadata: the summary plus what its manifest says about it. */
    ObjectNode versionDetail(Version v) {
        JsonNode manifest = manifest(v);
        ObjectNode node = json.createObjectNode().put("model", v.model());
        node.setAll(versionSummary(v));
        node.set("labels", manifest.path("labels").deepCopy());
        node.set("input_fields", manifest.path("input_fields").deepCopy());
        node.set("metrics", manifest.path("metrics").deepCopy());
        node.set("provenance", manifest.path("provenance").deepCopy());
        return node;
    }

    /**
     * The predict answer as UTF-8 JSON bytes, written straight through a generator: it is the
     * hottest response, and building a tree first costs more than the model itself. Same shape,
     * member order and number formatting as {@link #prediction}.
     */
    byte[] predictions(String model, LiveVersion served, List<Prediction> predictions) {
        ByteArrayOutputStream out = new ByteArrayOutputStream(64 + 160 * predictions.size());
        try (JsonGenerator g = json.getFactory().createGenerator(out)) {
            g.writeStartObject();
            g.writeStringField("model", model);
            g.writeStringField("version", served.tag());
            g.writeArrayFieldStart("results");
            for (Prediction p : predictions) {
                g.writeStartObject();
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
                g.writeEndObject();
            }
            g.writeEndArray();
            g.writeEndObject();
        } catch (IOException e) {
            throw new UncheckedIOException("writing a predict answer to memory failed", e);
        }
        return out.toByteArray();
    }

    ObjectNode explanations(String model, LiveVersion served, List<Explanation> explanations) {
        ObjectNode root = served(model, served);
        ArrayNode results = root.putArray("results");
        for (Explanation e : explanations) {
            ObjectNode node = prediction(e.prediction());
            node.put("intercept", e.intercept());
            ArrayNode contributions = node.putArray("contributions");
            for (Contribution c : e.contributions()) {
                contributions.addObject().put("feature", c.feature()).put("contribution", c.contribution());
            }
            node.put("features_used", e.featuresUsed());
            node.put("unknown_tokens", e.prediction().unknownTokens());
            results.add(node);
        }
        return root;
    }

    private ObjectNode served(String model, LiveVersion served) {
        return json.createObjectNode().put("model", model).put("version", served.tag());
    }

    private ObjectNode prediction(Prediction p) {
        ObjectNode node = json.createObjectNode().put("label", p.label()).put("score", p.score());
        if (p.truncatedTokens() > 0) {
            node.put("truncated_tokens", p.truncatedTokens());
        }
        if (p.probabilities() != null) {
            ObjectNode probabilities = node.putObject("probabilities");
            for (Map.Entry<String, Double> e : p.probabilities().entrySet()) {
                probabilities.put(e.getKey(), e.getValue());
            }
        }
        return node;
    }

    private JsonNode manifest(Version v) {
        try {
            return json.readTree(v.manifestJson());
        } catch (IOException e) {
            throw new UncheckedIOException("the stored manifest of " + v.model() + " " + v.tag() + " is not JSON", e);
        }
    }
}
