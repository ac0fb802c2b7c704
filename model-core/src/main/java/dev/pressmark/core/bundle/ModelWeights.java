package dev.pressmark.core.bundle;

import com.fasterxml.jackson.annotation.JsonProperty;
import dev.pressmark.core.classify.CalibratedClassifier;
import dev.pressmark.core.classify.LinearClassifier;
import dev.pressmark.core.classify.LinearWeights;
import dev.pressmark.core.classify.PlattScaling;
import dev.pressmark.core.classify.StoredLinearModel;
import dev.pressmark.core.classify.StoredLogisticModel;
import java.util.List;
import java.util.Objects;

/**
 * A trained classifier as a bundle keeps it: its kind, its weights ({@code weights.bin}) and, for
 * an SVM with probabilities, one Platt sigmoid per score (in the manifest).
 *
 * @param kind {@value #LINEAR_SVM} or {@value #LOGISTIC_REGRESSION}
 * @param weights the weights
 * @param platt one sigmoid per score, or empty for none
 */
public record ModelWeights(String kind, LinearWeights weights, List<PlattScaling> platt) {

    public static final String LINEAR_SVM = "linear-svm";
    public static final String LOGISTIC_REGRESSION = "logistic-regression";

    public ModelWeights {
        Objects.requireNonNull(kind, "kind");
        Objects.requireNonNull(weights, "weights");
        platt = List.copyOf(platt);
        if (!kind.equals(LINEAR_SVM) && !kind.equals(LOGISTIC_REGRESSION)) {
            throw new IllegalArgumentException("classifier kind must be linear-svm or logistic-regression, was \"" + kind + "\"");
        }
        if (!platt.isEmpty() && (kind.equals(LOGISTIC_REGRESSION) || platt.size() != weights.numScores())) {
            throw new IllegalArgumentException("platt needs one sigmoid per score of an SVM (" + weights.numScores()
                    + "), had " + platt.size() + " for " + kind);
        }
    }

    /** Whether predictions carry probabilities. */
    public boolean hasProbabilities() {
        return kind.equals(LOGISTIC_REGRESSION) || !platt.isEmpty();
    }

    /** The classifier to predict with; a {@link dev.pressmark.core.classify.ProbabilisticClassifier} when it has probabilities. */
    public LinearClassifier classifier() {
        if (kind.equals(LOGISTIC_REGRESSION)) {
            return new StoredLogisticModel(weights);
        }
        StoredLinearModel model = new StoredLinearModel(weights);
        return platt.isEmpty() ? model : new CalibratedClassifier<>(model, platt);
    }

    /** A Platt sigmoid as the manifest stores it. */
    record Sigmoid(@JsonProperty("a") double a, @JsonProperty("b") double b) {
    }
}
