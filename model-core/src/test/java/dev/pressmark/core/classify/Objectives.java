package dev.pressmark.core.classify;

import dev.pressmark.core.feature.SparseMatrix;

/** Per-score objectives of trained weights, for comparing a model with the reference's. */
final class Objectives {

    private Objectives() {
    }

    static boolean[] positives(int[] labels, int positiveClass) {
        boolean[] positive = new boolean[labels.length];
        for (int i = 0; i < labels.length; i++) {
            positive[i] = labels[i] == positiveClass;
        }
        return positive;
    }

    /** {@code c · weight(label)} per row; {@code classWeights} null means every class weighs 1. */
    static double[] costs(int[] labels, double c, double[] classWeights) {
        double[] cost = new double[labels.length];
        for (int i = 0; i < labels.length; i++) {
            cost[i] = c * (classWeights == null ? 1.0 : classWeights[labels[i]]);
        }
        return cost;
    }

    /** The positive class of each score: class 1 for two classes, else class {@code score}. */
    static int positiveClass(int numClasses, int score) {
        return numClasses == 2 ? 1 : score;
    }

    static double svm(SparseMatrix x, int[] labels, int numClasses, int score, double[] cost, SvmConfig config,
            double[] w) {
        return SvmSolver.primalObjective(x, positives(labels, positiveClass(numClasses, score)), cost, config.bias(),
                config.loss(), w);
    }

    static double logistic(SparseMatrix x, int[] labels, int numClasses, int score, double[] cost,
            LogisticConfig config, double[] w) {
        return LogisticSolver.primalObjective(x, positives(labels, positiveClass(numClasses, score)), cost,
                config.bias(), w);
    }

    static double accuracy(int[] predicted, int[] labels) {
        int correct = 0;
        for (int i = 0; i < labels.length; i++) {
            correct += predicted[i] == labels[i] ? 1 : 0;
        }
        return (double) correct / labels.length;
    }
}
