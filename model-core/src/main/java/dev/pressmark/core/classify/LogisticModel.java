package dev.pressmark.core.classify;

import java.util.Optional;

/**
 * A trained logistic regression, with how it was made. Its probabilities are the logistic
 * function of the decision values; with more than two classes, the one-versus-rest
 * probabilities are normalised to sum to 1. Immutable.
 */
public final class LogisticModel implements ProbabilisticClassifier {

    private final LinearWeights weights;
    private final LogisticConfig config;
    private final ClassWeights classWeights;
    private final long seed;
    private final Convergence convergence;

    LogisticModel(LinearWeights weights, LogisticConfig config, ClassWeights classWeights, long seed,
            Convergence convergence) {
        this.weights = weights;
        this.config = config;
        this.classWeights = classWeights;
        this.seed = seed;
        this.convergence = convergence;
    }

    @Override
    public LinearWeights weights() {
        return weights;
    }

    @Override
    public void probabilitiesOf(double[] decisionValues, double[] out) {
        Logistic.probabilities(decisionValues, decisionValues.length, out);
    }

    public LogisticConfig config() {
        return config;
    }

    public ClassWeights classWeights() {
        return classWeights;
    }

    public long seed() {
        return seed;
    }

    public Convergence convergence() {
        return convergence;
    }

    /** Whether every binary solve met the tolerance before the iteration cap. */
    public boolean converged() {
        return convergence.converged();
    }

    /** A warning to show the user when some solve stopped at the cap. */
    public Optional<String> warning() {
        return convergence.warning("logistic regression", config.maxIterations(), config.tolerance());
    }

    @Override
    public String toString() {
        return "LogisticModel[" + weights + ", " + config + ", converged " + converged() + "]";
    }
}
