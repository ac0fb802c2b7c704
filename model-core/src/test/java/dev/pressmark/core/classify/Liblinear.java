package dev.pressmark.core.classify;

import de.bwaldvogel.liblinear.Feature;
import de.bwaldvogel.liblinear.FeatureNode;
import de.bwaldvogel.liblinear.Linear;
import de.bwaldvogel.liblinear.Model;
import de.bwaldvogel.liblinear.Parameter;
import de.bwaldvogel.liblinear.Problem;
import de.bwaldvogel.liblinear.SolverType;
import dev.pressmark.core.feature.SparseMatrix;

/**
 * The reference: LIBLINEAR's Java port (de.bwaldvogel:liblinear 2.44, R.-E. Fan, K.-W. Chang,
 * C.-J. Hsieh, X.-R. Wang and C.-J. Lin, "LIBLINEAR: A library for large linear classification",
 * JMLR 9, 2008), run on the same rows, with the bias as its extra constant feature.
 */
final class Liblinear {

    static {
        Linear.disableDebugOutput();
    }

    private Liblinear() {
    }

    /**
     * A trained reference model, its weights rearranged into ours: one row per score, the feature
     * weights then the bias weight, score 0 of a binary model positive for class 1.
     */
    record Fit(Model model, double[][] weights, double bias) {

        int[] predict(SparseMatrix x) {
            Feature[][] rows = rows(x, bias);
            int[] out = new int[rows.length];
            for (int i = 0; i < rows.length; i++) {
                out[i] = (int) Linear.predict(model, rows[i]);
            }
            return out;
        }

        double[] predictProbability(SparseMatrix x, int row, int numClasses) {
            double[] byModelLabel = new double[numClasses];
            Linear.predictProbability(model, rows(x, bias)[row], byModelLabel);
            double[] byClass = new double[numClasses];
            int[] modelLabels = model.getLabels();
            for (int m = 0; m < numClasses; m++) {
                byClass[modelLabels[m]] = byModelLabel[m];
            }
            return byClass;
        }
    }

    /**
     * Trains the reference. {@code classWeights} may be null (all 1); every class must occur in
     * {@code labels}, as the reference numbers only the classes it sees.
     */
    static Fit train(SparseMatrix x, int[] labels, int numClasses, double bias, SolverType solver, double c,
            double eps, double[] classWeights) {
        Problem problem = new Problem();
        problem.l = x.rows();
        problem.n = x.columns() + (bias > 0.0 ? 1 : 0);
        problem.bias = bias > 0.0 ? bias : -1.0;
        problem.x = rows(x, bias);
        problem.y = new double[labels.length];
        for (int i = 0; i < labels.length; i++) {
            problem.y[i] = labels[i];
        }
        Parameter parameter = new Parameter(solver, c, eps);
        if (classWeights != null) {
            int[] weightLabels = new int[numClasses];
            for (int k = 0; k < numClasses; k++) {
                weightLabels[k] = k;
            }
            parameter.setWeights(classWeights, weightLabels);
        }
        Model model = Linear.train(problem, parameter);
        if (model.getNrClass() != numClasses) {
            throw new IllegalStateException("the reference saw " + model.getNrClass() + " classes, expected "
                    + numClasses);
        }
        return new Fit(model, ourLayout(model, x.columns(), numClasses, bias > 0.0), bias);
    }

    private static double[][] ourLayout(Model model, int columns, int numClasses, boolean hasBias) {
        double[] w = model.getFeatureWeights();
        int[] modelLabels = model.getLabels();
        int scores = numClasses == 2 ? 1 : numClasses;
        double[][] out = new double[scores][columns + 1];
        int stored = columns + (hasBias ? 1 : 0);
        if (scores == 1) {
            // The reference's single vector is positive for the first label it met.
            double sign = modelLabels[0] == 1 ? 1.0 : -1.0;
            for (int j = 0; j < stored; j++) {
                out[0][j] = sign * w[j];
            }
            return out;
        }
        for (int m = 0; m < numClasses; m++) {
            for (int j = 0; j < stored; j++) {
                out[modelLabels[m]][j] = w[j * numClasses + m];
            }
        }
        return out;
    }

    static Feature[][] rows(SparseMatrix x, double bias) {
        Feature[][] rows = new Feature[x.rows()][];
        for (int i = 0; i < x.rows(); i++) {
            int start = x.rowStart(i);
            int length = x.rowEnd(i) - start;
            Feature[] row = new Feature[length + (bias > 0.0 ? 1 : 0)];
            for (int k = 0; k < length; k++) {
                row[k] = new FeatureNode(x.column(start + k) + 1, x.value(start + k));
            }
            if (bias > 0.0) {
                row[length] = new FeatureNode(x.columns() + 1, bias);
            }
            rows[i] = row;
        }
        return rows;
    }
}
