package dev.pressmark.core.classify;

import java.util.Optional;

/**
 * A trained linear SVM, with how it was made: its settings, class weights, seed and how its
 * solves ended. Immutable.
 */
public final class SvmModel implements LinearClassifier {

    private final LinearWeights weights;
    private final SvmConfig config;
    private final ClassWeights classWeights;
    private final long seed;
    private final Convergence convergence;

    SvmModel(LinearWeights weights, SvmConfig config, ClassWeights classWeights, long seed,
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

    public SvmConfig config() {
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
        return convergence.warning("linear SVM", config.maxIterations(), config.tolerance());
    }

    @Override
    public String toString() {
        return "SvmModel[" + weights + ", " + config + ", converged " + converged() + "]";
    }
}
