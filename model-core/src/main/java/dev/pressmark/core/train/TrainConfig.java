package dev.pressmark.core.train;

import com.fasterxml.jackson.annotation.JsonCreator;
import com.fasterxml.jackson.annotation.JsonIgnore;
import com.fasterxml.jackson.annotation.JsonIgnoreProperties;
import com.fasterxml.jackson.annotation.JsonProperty;
import com.fasterxml.jackson.annotation.JsonPropertyOrder;
import com.fasterxml.jackson.core.JsonLocation;
import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.DeserializationFeature;
import com.fasterxml.jackson.databind.JsonMappingException;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.exc.InvalidFormatException;
import com.fasterxml.jackson.databind.exc.MismatchedInputException;
import com.fasterxml.jackson.databind.exc.UnrecognizedPropertyException;
import com.fasterxml.jackson.databind.exc.ValueInstantiationException;
import com.fasterxml.jackson.dataformat.yaml.YAMLFactory;
import com.fasterxml.jackson.dataformat.yaml.YAMLMapper;
import dev.pressmark.core.PressmarkException;
import dev.pressmark.core.io.InputFiles;
import dev.pressmark.core.feature.FeatureConfig;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Objects;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

/**
 * Everything {@code pressmark train} needs, read from {@code train.yaml}. Every key has a default;
 * an unknown key, a wrong type or a value out of bounds is an error naming the file, the line and
 * the key. The resolved config, defaults filled in, goes into the bundle's manifest. The
 * {@code search} section is {@link TrainPlan}'s to read.
 */
@JsonIgnoreProperties({"search"})
@JsonPropertyOrder({"name", "data", "split", "tokenizer", "features", "classifier", "evaluation"})
public record TrainConfig(
        @JsonProperty("name") String name,
        @JsonProperty("data") DataConfig data,
        @JsonProperty("split") SplitConfig split,
        @JsonIgnore List<TokenizerConfig> tokenizers,
        @JsonProperty("features") FeatureConfig features,
        @JsonProperty("classifier") ClassifierConfig classifier,
        @JsonProperty("evaluation") EvaluationConfig evaluation) {

    /** The most tokenizer entries (views of the text) a config may list. */
    public static final int MAX_TOKENIZERS = 8;

    /** The model name when the config names none. */
    public static final String DEFAULT_NAME = "model";
    /** Model names, as the store accepts them. */
    public static final Pattern NAME = Pattern.compile("[a-z0-9][a-z0-9-]{0,63}");

    public TrainConfig {
        Objects.requireNonNull(name, "name");
        if (!NAME.matcher(name).matches()) {
            throw new IllegalArgumentException("name must match " + NAME.pattern() + ", was \"" + name + "\"");
        }
        Objects.requireNonNull(data, "data");
        Objects.requireNonNull(split, "split");
        Objects.requireNonNull(tokenizers, "tokenizer");
        tokenizers = List.copyOf(tokenizers);
        if (tokenizers.isEmpty() || tokenizers.size() > MAX_TOKENIZERS) {
            throw new IllegalArgumentException("tokenizer must list 1 to " + MAX_TOKENIZERS + " entries, had "
                    + tokenizers.size());
        }
        Objects.requireNonNull(features, "features");
        Objects.requireNonNull(classifier, "classifier");
        Objects.requireNonNull(evaluation, "evaluation");
    }

    @JsonCreator
    static TrainConfig fromYaml(
            @JsonProperty("name") String name,
            @JsonProperty("data") DataConfig data,
            @JsonProperty("split") SplitConfig split,
            @JsonProperty("tokenizer") List<TokenizerConfig> tokenizers,
            @JsonProperty("features") FeaturesYaml features,
            @JsonProperty("classifier") ClassifierConfig classifier,
            @JsonProperty("evaluation") EvaluationConfig evaluation) {
        return new TrainConfig(
                name == null ? DEFAULT_NAME : name,
                data == null ? DataConfig.DEFAULT : data,
                split == null ? SplitConfig.DEFAULT : split,
                tokenizers == null ? List.of(TokenizerConfig.DEFAULT) : tokenizers,
                features == null ? FeatureConfig.defaults() : features.config(),
                classifier == null ? ClassifierConfig.DEFAULT : classifier,
                evaluation == null ? EvaluationConfig.DEFAULT : evaluation);
    }

    private static final ObjectMapper YAML = YAMLMapper.builder(new YAMLFactory())
            .enable(DeserializationFeature.FAIL_ON_UNKNOWN_PROPERTIES)
            .enable(DeserializationFeature.FAIL_ON_NULL_FOR_PRIMITIVES)
            .enable(DeserializationFeature.FAIL_ON_TRAILING_TOKENS)
            .disable(DeserializationFeature.ACCEPT_FLOAT_AS_INT)
            .enable(DeserializationFeature.ACCEPT_SINGLE_VALUE_AS_ARRAY)
            .build();

    /** Reads {@code file}; a relative {@code data.file} is resolved against the file's directory. */
    public static TrainConfig read(Path file) {
        String text = InputFiles.readString(file);
        TrainConfig config = parse(text, file.toString());
        Path base = file.toAbsolutePath().getParent();
        return config.withData(config.data.resolvedAgainst(base));
    }

    /** Parses YAML text; {@code source} names it in error messages. */
    public static TrainConfig parse(String yaml, String source) {
        if (yaml.isBlank()) {
            return fromYaml(null, null, null, null, null, null, null);
        }
        try {
            TrainConfig config = YAML.readValue(yaml, TrainConfig.class);
            // a document that is only a null scalar ("~", "null", a bare anchor) sets no key, as blank text does
            return config != null ? config : fromYaml(null, null, null, null, null, null, null);
        } catch (JsonMappingException e) {
            throw configError(source, yaml, e);
        } catch (JsonProcessingException e) {
            JsonLocation location = e.getLocation();
            throw new PressmarkException("invalid-config", source + (location == null ? "" : ": line " + location.getLineNr())
                    + ": not valid YAML: " + e.getOriginalMessage(), e);
        }
    }

    /** A config with one view of the text, as the first release had. */
    public TrainConfig(String name, DataConfig data, SplitConfig split, TokenizerConfig tokenizer, FeatureConfig features,
            ClassifierConfig classifier, EvaluationConfig evaluation) {
        this(name, data, split, List.of(tokenizer), features, classifier, evaluation);
    }

    /**
     * The {@code tokenizer} section as the manifest records it: the one mapping when there is one
     * view, as the first release wrote it, else the list.
     */
    @JsonProperty("tokenizer")
    Object tokenizerListed() {
        return tokenizers.size() == 1 ? tokenizers.get(0) : tokenizers;
    }

    /** The first (or only) tokenizer entry. */
    public TokenizerConfig tokenizer() {
        return tokenizers.get(0);
    }

    TrainConfig withData(DataConfig newData) {
        return new TrainConfig(name, newData, split, tokenizers, features, classifier, evaluation);
    }

    private static PressmarkException configError(String source, String yaml, JsonMappingException e) {
        String key = tokenizerKey(yaml, keyPath(e));
        String what;
        if (e instanceof UnrecognizedPropertyException unknown) {
            List<String> known = new ArrayList<>();
            unknown.getKnownPropertyIds().forEach(id -> known.add(String.valueOf(id)));
            known.sort(null);
            what = "unknown key \"" + key + "\"; known keys here: " + String.join(", ", known);
        } else if (e instanceof ValueInstantiationException && e.getCause() != null && e.getCause().getMessage() != null) {
            what = e.getCause().getMessage();
        } else if (e instanceof InvalidFormatException invalid) {
            what = key + ": expected " + describe(invalid.getTargetType()) + ", was \"" + invalid.getValue() + "\"";
        } else if (e instanceof MismatchedInputException mismatched && mismatched.getTargetType() != null) {
            what = key + ": expected " + describe(mismatched.getTargetType());
        } else {
            what = (key.isEmpty() ? "" : key + ": ") + e.getOriginalMessage();
        }
        what = withTokenizerIndex(yaml, key, what);
        // Jackson reports where it noticed, often the end of the section; the key's own line is
        // where a person looks, so find it when the message names one.
        Matcher named = LEADING_KEY.matcher(what);
        int line = KeyLines.find(yaml, named.lookingAt() ? named.group(1) : key);
        JsonLocation location = e.getLocation();
        if (line < 0 && location != null) {
            line = location.getLineNr();
        }
        return new PressmarkException("invalid-config", source + (line > 0 ? ": line " + line : "") + ": " + what, e);
    }

    private static final Pattern TOKENIZER_ENTRY = Pattern.compile("^tokenizer\\[(\\d+)]");

    /**
     * A key path in the spelling of the search grid's keys: {@code tokenizer.1.max_n} for an entry
     * of a tokenizer list, {@code tokenizer.max_n} when the section is one mapping.
     */
    private static String tokenizerKey(String yaml, String key) {
        Matcher entry = TOKENIZER_ENTRY.matcher(key);
        if (!entry.find()) {
            return key;
        }
        String rest = key.substring(entry.end());
        return tokenizerIsList(yaml) ? "tokenizer." + entry.group(1) + rest : "tokenizer" + rest;
    }

    private static boolean tokenizerIsList(String yaml) {
        try {
            return YAML.readTree(yaml).path("tokenizer").isArray();
        } catch (JsonProcessingException e) {
            return false;
        }
    }

    /**
     * "tokenizer.max_n must be ..." as "tokenizer.1.max_n must be ..." when the section is a list, so
     * that the message names the entry in the spelling of the search grid's keys.
     */
    private static String withTokenizerIndex(String yaml, String key, String what) {
        Matcher entry = Pattern.compile("^tokenizer\\.(\\d+)").matcher(key);
        if (!entry.find() || !what.startsWith("tokenizer.") || what.startsWith(key)) {
            return what;
        }
        return "tokenizer." + entry.group(1) + what.substring("tokenizer".length());
    }

    /** A message that starts with a dotted config key, such as {@code classifier.c must be > 0}. */
    private static final Pattern LEADING_KEY = Pattern.compile("(?:unknown key \")?([a-z_]+(?:\\.[a-z_0-9]+)*)\\b");

    private static String keyPath(JsonMappingException e) {
        List<String> parts = new ArrayList<>();
        for (JsonMappingException.Reference reference : e.getPath()) {
            if (reference.getFieldName() != null) {
                parts.add(reference.getFieldName());
            } else if (reference.getIndex() >= 0) {
                parts.add("[" + reference.getIndex() + "]");
            }
        }
        return String.join(".", parts).replace(".[", "[");
    }

    private static String describe(Class<?> type) {
        if (type == int.class || type == Integer.class || type == long.class || type == Long.class) {
            return "a whole number";
        }
        if (type == double.class || type == Double.class) {
            return "a number";
        }
        if (type == boolean.class || type == Boolean.class) {
            return "true or false";
        }
        if (List.class.isAssignableFrom(type)) {
            return "a list";
        }
        if (type == String.class) {
            return "a text value";
        }
        return "a " + type.getSimpleName().replaceAll("Config$", "").toLowerCase() + " section";
    }
}
