package dev.pressmark.core.search;

import com.fasterxml.jackson.databind.JsonNode;
import dev.pressmark.core.PressmarkException;
import dev.pressmark.core.evaluate.Metric;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.Set;

/**
 * The {@code search} section of a training config.
 *
 * @param grid the grid keys with their values, in the file's order
 * @param metric the cross-validated metric that ranks the candidates
 * @param pick how the candidate is chosen from their scores
 * @param warmStart whether each fit along increasing C starts from the previous C's solution
 */
public record SearchConfig(List<GridAxis> grid, Metric metric, Pick pick, boolean warmStart) {

    /** The most candidates a grid may span. */
    public static final int MAX_CANDIDATES = 1_000;
    public static final Metric DEFAULT_METRIC = Metric.ACCURACY;
    public static final Pick DEFAULT_PICK = Pick.BEST;
    public static final boolean DEFAULT_WARM_START = true;
    /** The config sections a grid key may change; the others (data, split, folds) every candidate shares. */
    public static final List<String> SEARCHABLE = List.of("tokenizer", "features", "classifier");

    private static final Set<String> KEYS = Set.of("grid", "metric", "pick", "warm_start");

    public SearchConfig {
        grid = List.copyOf(grid);
        Objects.requireNonNull(metric, "metric");
        Objects.requireNonNull(pick, "pick");
        if (grid.isEmpty()) {
            throw new IllegalArgumentException("search.grid must name at least one key");
        }
    }

    /** The number of candidates the grid spans (at most {@link #MAX_CANDIDATES}). */
    public int candidateCount() {
        long count = 1;
        for (GridAxis axis : grid) {
            count *= axis.values().size();
        }
        return (int) count;
    }

    /** Every candidate, in grid order: the first key varies slowest, the last fastest. */
    public List<Candidate> candidates() {
        List<Candidate> out = new ArrayList<>(candidateCount());
        int[] at = new int[grid.size()];
        for (int index = 0; index < candidateCount(); index++) {
            Map<String, JsonNode> settings = new LinkedHashMap<>();
            for (int k = 0; k < grid.size(); k++) {
                settings.put(grid.get(k).key(), grid.get(k).values().get(at[k]));
            }
            out.add(new Candidate(index, settings));
            for (int k = grid.size() - 1; k >= 0; k--) {
                if (++at[k] < grid.get(k).values().size()) {
                    break;
                }
                at[k] = 0;
            }
        }
        return out;
    }

    /**
     * Reads the {@code search} node of a config; {@code lines} and {@code source} place errors,
     * which are one-line {@code invalid-config} errors naming the key and its line.
     */
    public static SearchConfig parse(JsonNode node, YamlLines lines, String source) {
        Errors errors = new Errors(lines, source);
        if (!node.isObject()) {
            throw errors.at(lines.line("search"), "search must be a mapping with grid, metric and pick");
        }
        for (Map.Entry<String, JsonNode> field : node.properties()) {
            if (!KEYS.contains(field.getKey())) {
                throw errors.at(lines.line("search", field.getKey()), "unknown key \"search." + field.getKey()
                        + "\"; known keys here: grid, metric, pick, warm_start");
            }
        }
        List<GridAxis> grid = grid(node.path("grid"), errors);
        Metric metric = DEFAULT_METRIC;
        if (node.has("metric")) {
            try {
                metric = Metric.fromKey(text(node.get("metric"), "metric", errors));
            } catch (IllegalArgumentException e) {
                throw errors.at(lines.line("search", "metric"), "search.metric: " + e.getMessage());
            }
        }
        Pick pick = DEFAULT_PICK;
        if (node.has("pick")) {
            try {
                pick = Pick.fromKey(text(node.get("pick"), "pick", errors));
            } catch (IllegalArgumentException e) {
                throw errors.at(lines.line("search", "pick"), e.getMessage());
            }
        }
        boolean warmStart = DEFAULT_WARM_START;
        if (node.has("warm_start")) {
            if (!node.get("warm_start").isBoolean()) {
                throw errors.at(lines.line("search", "warm_start"), "search.warm_start: expected true or false, was "
                        + node.get("warm_start"));
            }
            warmStart = node.get("warm_start").booleanValue();
        }
        return new SearchConfig(grid, metric, pick, warmStart);
    }

    private static String text(JsonNode value, String key, Errors errors) {
        if (!value.isTextual()) {
            throw errors.at(errors.lines.line("search", key), "search." + key + ": expected a text value, was " + value);
        }
        return value.asText();
    }

    private static List<GridAxis> grid(JsonNode node, Errors errors) {
        int gridLine = errors.lines.line("search", "grid");
        if (node.isMissingNode() || node.isNull()) {
            throw errors.at(errors.lines.line("search"), "search.grid is missing: name at least one config key and its values,"
                    + " as in grid: {classifier.c: [0.1, 1, 10]}");
        }
        if (!node.isObject() || node.isEmpty()) {
            throw errors.at(gridLine, "search.grid must be a mapping from config keys to lists of values, was " + node);
        }
        List<GridAxis> axes = new ArrayList<>();
        long count = 1;
        for (Map.Entry<String, JsonNode> field : node.properties()) {
            String key = field.getKey();
            int line = errors.lines.line("search", "grid", key);
            JsonNode values = field.getValue();
            String section = key.contains(".") ? key.substring(0, key.indexOf('.')) : key;
            if (!SEARCHABLE.contains(section) || !key.contains(".")) {
                throw errors.at(line, "search.grid." + key + ": only keys under tokenizer, features and classifier can be searched"
                        + " (every candidate shares the data, the split and the folds)");
            }
            if (!values.isArray()) {
                throw errors.at(line, "search.grid." + key + ": expected a list of values, was " + values);
            }
            if (values.isEmpty()) {
                throw errors.at(line, "search.grid." + key + ": expected a list of at least one value, was an empty list");
            }
            List<JsonNode> list = new ArrayList<>();
            Set<JsonNode> seen = new HashSet<>();
            for (JsonNode value : values) {
                if (!seen.add(value)) {
                    throw errors.at(line, "search.grid." + key + ": the value " + value + " is listed twice");
                }
                list.add(value);
            }
            count *= list.size();
            if (count > MAX_CANDIDATES) {
                throw errors.at(gridLine, "search.grid spans " + total(node) + " candidates; the limit is " + MAX_CANDIDATES);
            }
            axes.add(new GridAxis(key, line, list));
        }
        return axes;
    }

    private static String total(JsonNode grid) {
        java.math.BigInteger total = java.math.BigInteger.ONE;
        for (JsonNode values : grid) {
            total = total.multiply(java.math.BigInteger.valueOf(values.isArray() ? Math.max(1, values.size()) : 1));
        }
        return String.format(java.util.Locale.ROOT, "%,d", total);
    }

    /** Makes the errors of one config file. */
    record Errors(YamlLines lines, String source) {
        PressmarkException at(int line, String message) {
            return new PressmarkException("invalid-config", source + (line > 0 ? ": line " + line : "") + ": " + message);
        }
    }
}
