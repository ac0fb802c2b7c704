package dev.pressmark.core.drift;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.JsonNodeFactory;
import com.fasterxml.jackson.databind.node.ObjectNode;
import dev.pressmark.core.bundle.Bundle;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Objects;
import java.util.OptionalLong;
import java.util.Set;

/**
 * What the training rows looked like, as a bundle's {@code profile.json} records it.
 *
 * @param rows the number of training rows
 * @param tokens the number of tokens in them, over every text field
 * @param unknownRate the share of those tokens the model cannot use, in [0, 1]
 * @param tokensPerRow tokens per training row
 * @param topFeatures the most frequent features, each with the number of training rows holding it
 * @param documentFrequencyTotal the sum of the document frequencies of every distinct (field, token)
 *     of the training rows, features or not; absent in bundles written before it was recorded, and
 *     then the index compares the top features' shares among themselves only
 */
public record DriftProfile(int rows, long tokens, double unknownRate, LengthSummary tokensPerRow, List<TopFeature> topFeatures,
        OptionalLong documentFrequencyTotal) {

    /** The key under which newer bundles record {@link #documentFrequencyTotal}. */
    public static final String DOCUMENT_FREQUENCY_TOTAL = "document_frequency_total";

    /** A frequent training feature ({@code field:token}) and the number of training rows it occurs in. */
    public record TopFeature(String feature, int documentFrequency) {

        public TopFeature {
            if (feature == null || feature.isEmpty()) {
                throw new IllegalArgumentException("feature must be a non-empty field:token name");
            }
            if (documentFrequency < 0) {
                throw new IllegalArgumentException("document_frequency of " + feature + " must be >= 0 rows, was " + documentFrequency);
            }
        }
    }

    public DriftProfile {
        if (rows < 0) {
            throw new IllegalArgumentException("rows must be >= 0, was " + rows);
        }
        if (tokens < 0) {
            throw new IllegalArgumentException("tokens must be >= 0, was " + tokens);
        }
        if (!(unknownRate >= 0.0 && unknownRate <= 1.0)) {
            throw new IllegalArgumentException("unknown_rate must be a share in [0, 1], was " + unknownRate);
        }
        Objects.requireNonNull(tokensPerRow, "tokensPerRow");
        topFeatures = List.copyOf(topFeatures);
        Objects.requireNonNull(documentFrequencyTotal, "documentFrequencyTotal");
        Set<String> seen = new HashSet<>();
        long sum = 0;
        for (TopFeature feature : topFeatures) {
            if (!seen.add(feature.feature())) {
                throw new IllegalArgumentException("top_features lists " + feature.feature() + " twice");
            }
            if (feature.documentFrequency() > rows) {
                throw new IllegalArgumentException("document_frequency of " + feature.feature() + " must be <= rows (" + rows + "), was "
                        + feature.documentFrequency());
            }
            sum += feature.documentFrequency();
        }
        if (documentFrequencyTotal.isPresent() && documentFrequencyTotal.getAsLong() < sum) {
            throw new IllegalArgumentException("document_frequency_total must be >= the top features' sum (" + sum + "), was "
                    + documentFrequencyTotal.getAsLong());
        }
    }

    /** The profile of {@code bundle}. */
    public static DriftProfile of(Bundle bundle) {
        return read(bundle.profile(), bundle.name() + " profile.json");
    }

    /** Reads a profile; {@code source} names it in messages. */
    public static DriftProfile read(JsonNode node, String source) {
        try {
            if (node == null || !node.isObject()) {
                throw new IllegalArgumentException("the profile must be a JSON object");
            }
            JsonNode lengths = field(node, "tokens_per_row");
            if (!lengths.isObject()) {
                throw new IllegalArgumentException("tokens_per_row must be an object with mean, p10, p50 and p90");
            }
            LengthSummary tokensPerRow = new LengthSummary(number(lengths, "mean", "tokens_per_row.mean"), number(lengths, "p10", "tokens_per_row.p10"),
                    number(lengths, "p50", "tokens_per_row.p50"), number(lengths, "p90", "tokens_per_row.p90"));
            JsonNode top = field(node, "top_features");
            if (!top.isArray()) {
                throw new IllegalArgumentException("top_features must be an array");
            }
            List<TopFeature> features = new ArrayList<>(top.size());
            for (int i = 0; i < top.size(); i++) {
                JsonNode entry = top.get(i);
                String where = "top_features[" + i + "]";
                JsonNode name = field(entry, "feature", where + ".feature");
                if (!name.isTextual()) {
                    throw new IllegalArgumentException(where + ".feature must be a string, was " + name);
                }
                features.add(new TopFeature(name.asText(), (int) integer(entry, "document_frequency", where + ".document_frequency", Integer.MAX_VALUE)));
            }
            OptionalLong total = node.has(DOCUMENT_FREQUENCY_TOTAL)
                    ? OptionalLong.of(integer(node, DOCUMENT_FREQUENCY_TOTAL, DOCUMENT_FREQUENCY_TOTAL, Long.MAX_VALUE))
                    : OptionalLong.empty();
            return new DriftProfile((int) integer(node, "rows", "rows", Integer.MAX_VALUE), integer(node, "tokens", "tokens", Long.MAX_VALUE),
                    number(node, "unknown_rate", "unknown_rate"), tokensPerRow, features, total);
        } catch (IllegalArgumentException e) {
            throw new DriftException(DriftException.PROFILE, source + ": " + e.getMessage(), e);
        }
    }

    /**
     * The profile as {@code profile.json} holds it: the one writer beside {@link #read}. The
     * percentiles are nearest-rank token counts, so they are written as whole numbers; the mean
     * as a decimal.
     */
    public ObjectNode toJson() {
        ObjectNode node = JsonNodeFactory.instance.objectNode();
        node.put("rows", rows);
        node.put("tokens", tokens);
        node.put("unknown_rate", unknownRate);
        documentFrequencyTotal.ifPresent(total -> node.put(DOCUMENT_FREQUENCY_TOTAL, total));
        ObjectNode length = node.putObject("tokens_per_row");
        length.put("mean", tokensPerRow.mean());
        length.set("p10", count(tokensPerRow.p10()));
        length.set("p50", count(tokensPerRow.p50()));
        length.set("p90", count(tokensPerRow.p90()));
        ArrayNode top = node.putArray("top_features");
        for (TopFeature feature : topFeatures) {
            top.addObject().put("feature", feature.feature()).put("document_frequency", feature.documentFrequency());
        }
        return node;
    }

    /** A whole count as an integer, anything else as it is. */
    private static JsonNode count(double value) {
        return value == Math.rint(value) && Math.abs(value) < Integer.MAX_VALUE
                ? JsonNodeFactory.instance.numberNode((int) value) : JsonNodeFactory.instance.numberNode(value);
    }

    private static JsonNode field(JsonNode node, String key) {
        return field(node, key, key);
    }

    private static JsonNode field(JsonNode node, String key, String path) {
        JsonNode value = node == null ? null : node.get(key);
        if (value == null || value.isNull()) {
            throw new IllegalArgumentException("missing field " + path);
        }
        return value;
    }

    private static double number(JsonNode node, String key, String path) {
        JsonNode value = field(node, key, path);
        if (!value.isNumber()) {
            throw new IllegalArgumentException(path + " must be a number, was " + value);
        }
        return value.asDouble();
    }

    private static long integer(JsonNode node, String key, String path, long max) {
        JsonNode value = field(node, key, path);
        if (!value.isIntegralNumber() || !value.canConvertToLong() || value.asLong() > max) {
            throw new IllegalArgumentException(path + " must be a whole number up to " + max + ", was " + value);
        }
        return value.asLong();
    }
}
