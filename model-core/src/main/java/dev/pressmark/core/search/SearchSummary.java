package dev.pressmark.core.search;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.node.JsonNodeFactory;
import com.fasterxml.jackson.databind.node.ObjectNode;
import dev.pressmark.core.evaluate.Metric;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;

/**
 * What a search found, as the bundle's manifest records it under {@code search}: the metric, the
 * pick, every candidate's settings and cross-validated score, and the index of the chosen one.
 * This record is the one reader and writer of that object.
 *
 * @param metric the metric that ranked the candidates
 * @param pick the rule that chose
 * @param candidates every candidate in grid order
 * @param chosen the index of the chosen candidate
 */
public record SearchSummary(Metric metric, Pick pick, List<Scored> candidates, int chosen) {

    /** The key of the training config's search section, and of this object in a manifest. */
    public static final String KEY = "search";

    /**
     * One candidate's result.
     *
     * @param settings grid key to value
     * @param mean the metric's cross-validated mean
     * @param standardError its standard error over the folds
     */
    public record Scored(Map<String, JsonNode> settings, double mean, double standardError) {
        public Scored {
            settings = java.util.Collections.unmodifiableMap(new LinkedHashMap<>(settings));
        }
    }

    public SearchSummary {
        Objects.requireNonNull(metric, "metric");
        Objects.requireNonNull(pick, "pick");
        candidates = List.copyOf(candidates);
        if (chosen < 0 || chosen >= candidates.size()) {
            throw new IllegalArgumentException("chosen must be in [0, " + candidates.size() + "), was " + chosen);
        }
    }

    /** The manifest's {@code search} object. */
    public ObjectNode toJson() {
        ObjectNode node = JsonNodeFactory.instance.objectNode();
        node.put("metric", metric.key());
        node.put("pick", pick.key());
        var list = node.putArray("candidates");
        for (Scored candidate : candidates) {
            ObjectNode entry = list.addObject();
            ObjectNode settings = entry.putObject("settings");
            candidate.settings.forEach(settings::set);
            entry.putObject("cv").put("mean", candidate.mean).put("std_err", candidate.standardError);
        }
        node.put("chosen", chosen);
        return node;
    }

    /** Reads the manifest's {@code search} object. */
    public static SearchSummary fromJson(JsonNode node) {
        List<Scored> candidates = new ArrayList<>();
        for (JsonNode entry : node.path("candidates")) {
            Map<String, JsonNode> settings = new LinkedHashMap<>();
            entry.path("settings").properties().forEach(field -> settings.put(field.getKey(), field.getValue()));
            candidates.add(new Scored(settings, entry.path("cv").path("mean").asDouble(), entry.path("cv").path("std_err").asDouble()));
        }
        return new SearchSummary(Metric.fromKey(node.path("metric").asText()), Pick.fromKey(node.path("pick").asText()),
                candidates, node.path("chosen").asInt());
    }

    /** The grid keys, in order. */
    public List<String> keys() {
        return candidates.isEmpty() ? List.of() : List.copyOf(candidates.get(0).settings.keySet());
    }

    /** A value as a table shows it: text without quotes, numbers as written. */
    public static String show(JsonNode value) {
        return value.isTextual() ? value.asText() : value.toString();
    }
}
