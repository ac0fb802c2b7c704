package dev.pressmark.core.classify;

import dev.pressmark.core.feature.SparseMatrix;
import java.util.ArrayList;
import java.util.List;
import java.util.Objects;

/**
 * Trains linear SVMs with {@link SvmSolver}: one binary problem for two classes, one versus rest
 * for more, each example's cost {@code c} times its class weight.
 */
public final class SvmTrainer implements Trainer<SvmModel> {

    private final SvmConfig config;
    private final ClassWeights classWeights;

    public SvmTrainer(SvmConfig config, ClassWeights classWeights) {
        this.config = Objects.requireNonNull(config, "config");
        this.classWeights = Objects.requireNonNull(classWeights, "classWeights");
    }

    /** A trainer without class weights. */
    public SvmTrainer(SvmConfig config) {
        this(config, ClassWeights.none());
    }

    public SvmConfig config() {
        return config;
    }

    public ClassWeights classWeights() {
        return classWeights;
    }

    @Override
    public SvmModel train(SparseMatrix x, int[] labels, int numClasses, long seed) {
        Labels.checkTrainingSet(x, labels, numClasses);
        List<SolverRun> runs = new ArrayList<>();
        double[][] w = solve(x, labels, OneVsRest.positiveClasses(numClasses),
                OneVsRest.costs(labels, config.c(), classWeights.resolve(labels, numClasses)), seed, runs);
        return new SvmModel(LinearWeights.own(numClasses, x.columns(), config.bias(), w), config, classWeights,
                seed, new Convergence(runs));
    }

    /** The weight vectors of the binary problems "class k against the rest", k in {@code positiveClasses}. */
    double[][] solve(SparseMatrix x, int[] labels, int[] positiveClasses, double[] cost, long seed,
            List<SolverRun> runs) {
        double[] alpha = new double[x.rows()];
        return OneVsRest.solve(x, labels, positiveClasses, cost, seed,
                (positive, costs, random, w) -> SvmSolver.solve(x, positive, costs, config, random, w, alpha), runs);
    }
}
