package dev.pressmark.core.train;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.node.ObjectNode;
import com.fasterxml.jackson.dataformat.yaml.YAMLMapper;
import dev.pressmark.core.PressmarkException;
import dev.pressmark.core.io.InputFiles;
import dev.pressmark.core.search.Candidate;
import dev.pressmark.core.search.ConfigTree;
import dev.pressmark.core.search.GridAxis;
import dev.pressmark.core.search.SearchConfig;
import dev.pressmark.core.search.SearchSummary;
import dev.pressmark.core.search.YamlLines;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.regex.Pattern;

/**
 * What {@code pressmark train} will do, read from {@code train.yaml}: train one config, or, when
 * the file has a {@code search} section, score every candidate of its grid and train the chosen
 * one. Each candidate is the file with the candidate's values written in (see {@link ConfigTree}),
 * read by {@link TrainConfig}'s own parser, so every check of a config applies to every candidate;
 * a fault is reported at the grid key's line.
 *
 * @param config the config as written (without a search: the one that is trained)
 * @param search the search, or null when the file has none
 */
public record TrainPlan(TrainConfig config, Search search) {

    /**
     * A search's candidates.
     *
     * @param settings the {@code search} section
     * @param candidates the grid's candidates, in grid order
     * @param configs each candidate's full config, in the same order
     */
    public record Search(SearchConfig settings, List<Candidate> candidates, List<TrainConfig> configs) {
        public Search {
            Objects.requireNonNull(settings, "settings");
            candidates = List.copyOf(candidates);
            configs = List.copyOf(configs);
        }
    }

    public TrainPlan {
        Objects.requireNonNull(config, "config");
    }

    /** A plan without a search. */
    public static TrainPlan of(TrainConfig config) {
        return new TrainPlan(config, null);
    }

    private static final ObjectMapper YAML = new YAMLMapper();
    private static final ObjectMapper JSON = new ObjectMapper();
    /** The source name given to the config parser for a candidate, so that its messages can be re-placed. */
    private static final String CANDIDATE = "<candidate>";
    private static final Pattern CANDIDATE_PREFIX = Pattern.compile("^" + Pattern.quote(CANDIDATE) + "(?:: line \\d+)?: ");

    /** Reads {@code file}; a relative {@code data.file} is resolved against the file's directory. */
    public static TrainPlan read(Path file) {
        String text = InputFiles.readString(file);
        TrainPlan plan = parse(text, file.toString());
        DataConfig data = plan.config.data().resolvedAgainst(file.toAbsolutePath().getParent());
        if (plan.search == null) {
            return of(plan.config.withData(data));
        }
        List<TrainConfig> configs = new ArrayList<>();
        plan.search.configs.forEach(candidate -> configs.add(candidate.withData(data)));
        return new TrainPlan(plan.config.withData(data), new Search(plan.search.settings, plan.search.candidates, configs));
    }

    /** Parses YAML text; {@code source} names it in error messages. */
    public static TrainPlan parse(String yaml, String source) {
        TrainConfig config = TrainConfig.parse(yaml, source);
        JsonNode tree;
        try {
            tree = YAML.readTree(yaml);
        } catch (JsonProcessingException e) {
            throw new PressmarkException("invalid-config", source + ": not valid YAML: " + e.getOriginalMessage(), e);
        }
        if (!(tree instanceof ObjectNode root) || !root.has(SearchSummary.KEY)) {
            return of(config);
        }
        YamlLines lines = YamlLines.of(yaml);
        SearchConfig settings = SearchConfig.parse(root.get(SearchSummary.KEY), lines, source);
        ObjectNode base = root.deepCopy();
        base.remove(SearchSummary.KEY);
        for (GridAxis axis : settings.grid()) {
            for (JsonNode value : axis.values()) {
                candidate(base, Map.of(axis.key(), value), source, axis.line(), "search.grid." + axis.key() + " = "
                        + SearchSummary.show(value));
            }
        }
        int gridLine = lines.line("search", "grid");
        List<Candidate> candidates = settings.candidates();
        List<TrainConfig> configs = new ArrayList<>(candidates.size());
        Map<TrainConfig, Candidate> seen = new HashMap<>();
        for (Candidate candidate : candidates) {
            TrainConfig parsed = candidate(base, candidate.settings(), source, gridLine, "search.grid: the candidate "
                    + candidate.describe());
            Candidate same = seen.putIfAbsent(parsed, candidate);
            if (same != null) {
                throw error(source, gridLine, "search.grid: the candidates " + same.describe() + " and " + candidate.describe()
                        + " are the same config (equal values, or a key that has no effect beside the others)");
            }
            configs.add(parsed);
        }
        return new TrainPlan(config, new Search(settings, candidates, configs));
    }

    private static TrainConfig candidate(ObjectNode base, Map<String, JsonNode> settings, String source, int line, String what) {
        ObjectNode tree;
        try {
            tree = ConfigTree.apply(base, settings);
        } catch (IllegalArgumentException e) {
            throw error(source, line, "search.grid." + e.getMessage());
        }
        try {
            return TrainConfig.parse(JSON.writeValueAsString(tree), CANDIDATE);
        } catch (PressmarkException e) {
            throw error(source, line, what + ": " + CANDIDATE_PREFIX.matcher(e.getMessage()).replaceFirst(""));
        } catch (JsonProcessingException e) {
            throw new IllegalStateException(e);
        }
    }

    private static PressmarkException error(String source, int line, String message) {
        return new PressmarkException("invalid-config", source + (line > 0 ? ": line " + line : "") + ": " + message);
    }
}
