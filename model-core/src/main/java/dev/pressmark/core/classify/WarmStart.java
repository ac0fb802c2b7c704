package dev.pressmark.core.classify;

import java.util.ArrayList;
import java.util.List;

/**
 * The dual solutions of a trainer's binary problems, kept so that the next fit on the same rows,
 * at a larger C, starts from them (see {@link SvmSolver} and {@link LogisticSolver}). One object
 * serves one path of fits on one matrix; it is not shared between threads.
 */
public final class WarmStart {

    private final List<double[]> alphas = new ArrayList<>();
    private int rows = -1;
    private double c = Double.NaN;

    /** The scale for the duals left by the previous fit, for a fit at {@code newC}: {@code newC / c}. */
    double scaleTo(double newC) {
        return Double.isNaN(c) ? 0.0 : newC / c;
    }

    /** Records that the duals now held are the solutions at {@code c}. */
    void solvedAt(double newC) {
        c = newC;
    }

    /** Whether binary problem {@code problem} has a solution on {@code rows} rows to start from. */
    boolean has(int problem, int rows) {
        return this.rows == rows && problem < alphas.size();
    }

    /** The dual vector of binary problem {@code problem}: the previous solution, or zeros the first time. */
    double[] alpha(int problem, int rows) {
        if (this.rows != rows) {
            alphas.clear();
            this.rows = rows;
        }
        while (alphas.size() <= problem) {
            alphas.add(new double[rows]);
        }
        return alphas.get(problem);
    }
}
