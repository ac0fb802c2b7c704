package dev.pressmark.core.classify;

import dev.pressmark.core.feature.SparseMatrix;
import java.util.ArrayList;
import java.util.List;
import java.util.Objects;

/**
 * Trains logistic regressions with {@link LogisticSolver}: one binary problem for two classes,
 * one versus rest for more, each example's cost {@code c} times its class weight times its case
 * weight (1 unless given).
 */
public final class LogisticTrainer implements Trainer<LogisticModel> {

    private final LogisticConfig config;
    private final ClassWeights classWeights;

    public LogisticTrainer(LogisticConfig config, ClassWeights classWeights) {
        this.config = Objects.requireNonNull(config, "config");
        this.classWeights = Objects.requireNonNull(classWeights, "classWeights");
    }

    /** A trainer without class weights. */
    public LogisticTrainer(LogisticConfig config) {
        this(config, ClassWeights.none());
    }

    public LogisticConfig config() {
        return config;
    }

    public ClassWeights classWeights() {
        return classWeights;
    }

    @Override
    public LogisticModel train(SparseMatrix x, int[] labels, int numClasses, long seed) {
        return train(x, labels, numClasses, seed, null);
    }

    /**
     * Trains as {@link #train(SparseMatrix, int[], int, long)} does, each binary problem starting
     * from its solution in {@code warm} (a previous fit on the same rows at a smaller C) when there is
     * one, and leaving its new solution there for the next fit; {@code null} starts cold.
     */
    public LogisticModel train(SparseMatrix x, int[] labels, int numClasses, long seed, WarmStart warm) {
        return train(x, labels, null, numClasses, seed, warm);
    }

    /**
     * Trains as {@link #train(SparseMatrix, int[], int, long, WarmStart)} does, row {@code i}'s cost
     * {@code c · classWeight(labels[i]) · caseWeights[i]}; a row of case weight 0 counts nowhere.
     *
     * @param caseWeights one finite weight {@code >= 0} per row, or {@code null} for all 1
     */
    public LogisticModel train(SparseMatrix x, int[] labels, double[] caseWeights, int numClasses, long seed, WarmStart warm) {
        Labels.checkTrainingSet(x, labels, numClasses);
        List<SolverRun> runs = new ArrayList<>();
        double[] cost = OneVsRest.costs(labels, config.c(), classWeights.resolve(labels, numClasses), caseWeights);
        double[][] w = solve(x, labels, OneVsRest.positiveClasses(numClasses), cost, seed, runs, warm);
        if (warm != null) {
            warm.solvedAt(config.c());
        }
        return new LogisticModel(LinearWeights.own(numClasses, x.columns(), config.bias(), w), config,
                classWeights, seed, new Convergence(runs));
    }

    /** The weight vectors of the binary problems "class k against the rest", k in {@code positiveClasses}. */
    double[][] solve(SparseMatrix x, int[] labels, int[] positiveClasses, double[] cost, long seed,
            List<SolverRun> runs) {
        return solve(x, labels, positiveClasses, cost, seed, runs, null);
    }

    private double[][] solve(SparseMatrix x, int[] labels, int[] positiveClasses, double[] cost, long seed,
            List<SolverRun> runs, WarmStart warm) {
        return OneVsRest.solve(x, labels, positiveClasses, cost, seed, runs, warm, config.c(),
                (positive, costs, random, w, alpha, scale) ->
                        LogisticSolver.solve(x, positive, costs, config, random, w, alpha, scale));
    }
}
