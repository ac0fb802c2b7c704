package dev.pressmark.core.train;

import com.fasterxml.jackson.annotation.JsonCreator;
import com.fasterxml.jackson.annotation.JsonProperty;
import com.fasterxml.jackson.annotation.JsonPropertyOrder;
import com.fasterxml.jackson.annotation.JsonValue;
import com.fasterxml.jackson.databind.JsonNode;
import dev.pressmark.core.classify.ClassWeights;
import dev.pressmark.core.classify.LogisticConfig;
import dev.pressmark.core.classify.SvmConfig;
import dev.pressmark.core.classify.SvmLoss;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.TreeMap;

/**
 * The {@code classifier} section.
 *
 * @param kind {@code linear-svm} or {@code logistic-regression}
 * @param c the cost of a training error against the L2 regulariser, &gt; 0
 * @param loss the SVM's loss, {@code squared-hinge} or {@code hinge}; not used by logistic regression
 * @param classWeight {@code none}, {@code balanced}, or a map from label to weight
 * @param probabilities {@code platt} (the SVM's scores calibrated on out-of-fold decision values)
 *     or {@code none}; logistic regression has probabilities of its own
 * @param tolerance the solver's stopping tolerance, &gt; 0
 * @param maxIterations the solver's cap on passes over the data; hitting it is reported
 */
@JsonPropertyOrder({"kind", "c", "loss", "class_weight", "probabilities", "tolerance", "max_iterations"})
public record ClassifierConfig(
        @JsonProperty("kind") Kind kind,
        @JsonProperty("c") double c,
        @JsonProperty("loss") Loss loss,
        @JsonProperty("class_weight") ClassWeight classWeight,
        @JsonProperty("probabilities") Probabilities probabilities,
        @JsonProperty("tolerance") double tolerance,
        @JsonProperty("max_iterations") int maxIterations) {

    public static final ClassifierConfig DEFAULT = new ClassifierConfig(Kind.LINEAR_SVM, SvmConfig.DEFAULT_C, Loss.SQUARED_HINGE,
            ClassWeight.NONE, Probabilities.PLATT, SvmConfig.DEFAULT_TOLERANCE, SvmConfig.DEFAULT_MAX_ITERATIONS);

    public ClassifierConfig {
        Objects.requireNonNull(kind, "classifier.kind");
        Objects.requireNonNull(loss, "classifier.loss");
        Objects.requireNonNull(classWeight, "classifier.class_weight");
        Objects.requireNonNull(probabilities, "classifier.probabilities");
        if (!(c > 0) || Double.isInfinite(c)) {
            throw new IllegalArgumentException("classifier.c must be > 0, was " + c);
        }
        if (!(tolerance > 0) || Double.isInfinite(tolerance)) {
            throw new IllegalArgumentException("classifier.tolerance must be > 0, was " + tolerance);
        }
        if (maxIterations < 1) {
            throw new IllegalArgumentException("classifier.max_iterations must be >= 1, was " + maxIterations);
        }
    }

    @JsonCreator
    static ClassifierConfig fromYaml(
            @JsonProperty("kind") String kind,
            @JsonProperty("c") Double c,
            @JsonProperty("loss") String loss,
            @JsonProperty("class_weight") JsonNode classWeight,
            @JsonProperty("probabilities") String probabilities,
            @JsonProperty("tolerance") Double tolerance,
            @JsonProperty("max_iterations") Integer maxIterations) {
        return new ClassifierConfig(
                kind == null ? DEFAULT.kind : Keyed.find(Kind.values(), kind, "classifier.kind"),
                c == null ? DEFAULT.c : c,
                loss == null ? DEFAULT.loss : Keyed.find(Loss.values(), loss, "classifier.loss"),
                classWeight == null || classWeight.isNull() ? ClassWeight.NONE : ClassWeight.fromYaml(classWeight),
                probabilities == null ? DEFAULT.probabilities : Keyed.find(Probabilities.values(), probabilities, "classifier.probabilities"),
                tolerance == null ? DEFAULT.tolerance : tolerance,
                maxIterations == null ? DEFAULT.maxIterations : maxIterations);
    }

    /** The SVM solver's settings. */
    public SvmConfig svmConfig() {
        return new SvmConfig(c, loss.svmLoss, tolerance, maxIterations, SvmConfig.DEFAULT_BIAS);
    }

    /** The logistic regression solver's settings. */
    public LogisticConfig logisticConfig() {
        return new LogisticConfig(c, tolerance, maxIterations, LogisticConfig.DEFAULT_BIAS);
    }

    /** Whether the model gives probabilities: Platt scaling for the SVM, always for logistic regression. */
    public boolean hasProbabilities() {
        return kind == Kind.LOGISTIC_REGRESSION || probabilities == Probabilities.PLATT;
    }

    /** An enum constant with a stable lower-case key, as the config file spells it. */
    interface Keyed {
        String key();

        static <E extends Keyed> E find(E[] values, String key, String configKey) {
            StringBuilder known = new StringBuilder();
            for (E value : values) {
                if (value.key().equals(key)) {
                    return value;
                }
                known.append(known.length() == 0 ? "" : ", ").append(value.key());
            }
            throw new IllegalArgumentException(configKey + " must be one of " + known + "; was \"" + key + "\"");
        }
    }

    /** The classifier family. */
    public enum Kind implements Keyed {
        LINEAR_SVM("linear-svm"),
        LOGISTIC_REGRESSION("logistic-regression");

        private final String key;

        Kind(String key) {
            this.key = key;
        }

        @Override
        @JsonValue
        public String key() {
            return key;
        }
    }

    /** The SVM's loss. */
    public enum Loss implements Keyed {
        SQUARED_HINGE("squared-hinge", SvmLoss.SQUARED_HINGE),
        HINGE("hinge", SvmLoss.HINGE);

        private final String key;
        private final SvmLoss svmLoss;

        Loss(String key, SvmLoss svmLoss) {
            this.key = key;
            this.svmLoss = svmLoss;
        }

        @Override
        @JsonValue
        public String key() {
            return key;
        }
    }

    /** How probabilities are made. */
    public enum Probabilities implements Keyed {
        PLATT("platt"),
        NONE("none");

        private final String key;

        Probabilities(String key) {
            this.key = key;
        }

        @Override
        @JsonValue
        public String key() {
            return key;
        }
    }

    /**
     * Class weights as the config gives them: {@code none}, {@code balanced}, or weights by label.
     *
     * @param mode {@code none}, {@code balanced} or {@code map}
     * @param weights for {@code map}, the weight of each named label (sorted by label)
     */
    public record ClassWeight(String mode, Map<String, Double> weights) {

        public static final ClassWeight NONE = new ClassWeight("none", Map.of());
        public static final ClassWeight BALANCED = new ClassWeight("balanced", Map.of());

        public ClassWeight {
            weights = new TreeMap<>(weights);
            for (Map.Entry<String, Double> entry : weights.entrySet()) {
                if (!(entry.getValue() > 0) || entry.getValue().isInfinite()) {
                    throw new IllegalArgumentException("classifier.class_weight." + entry.getKey() + " must be > 0, was " + entry.getValue());
                }
            }
        }

        static ClassWeight fromYaml(JsonNode node) {
            if (node.isTextual()) {
                return switch (node.asText()) {
                    case "none" -> NONE;
                    case "balanced" -> BALANCED;
                    default -> throw new IllegalArgumentException(
                            "classifier.class_weight must be none, balanced or a map from label to weight; was \"" + node.asText() + "\"");
                };
            }
            if (!node.isObject()) {
                throw new IllegalArgumentException("classifier.class_weight must be none, balanced or a map from label to weight");
            }
            Map<String, Double> weights = new HashMap<>();
            for (Map.Entry<String, JsonNode> field : node.properties()) {
                if (!field.getValue().isNumber()) {
                    throw new IllegalArgumentException("classifier.class_weight." + field.getKey() + " must be a number, was " + field.getValue());
                }
                weights.put(field.getKey(), field.getValue().asDouble());
            }
            return new ClassWeight("map", weights);
        }

        /** The YAML form: the mode's name, or the map. */
        @JsonValue
        Object yaml() {
            return mode.equals("map") ? weights : mode;
        }

        /** These weights for the classes named {@code labels} (index = class). */
        public ClassWeights resolve(List<String> labels) {
            switch (mode) {
                case "none":
                    return ClassWeights.none();
                case "balanced":
                    return ClassWeights.balanced();
                default:
                    Map<Integer, Double> byIndex = new HashMap<>();
                    for (Map.Entry<String, Double> entry : weights.entrySet()) {
                        int index = labels.indexOf(entry.getKey());
                        if (index < 0) {
                            throw new IllegalArgumentException("classifier.class_weight names \"" + entry.getKey()
                                    + "\", which is not a label; the labels are " + labels);
                        }
                        byIndex.put(index, entry.getValue());
                    }
                    return ClassWeights.of(byIndex);
            }
        }
    }
}
