package dev.pressmark.core.classify;

import java.util.Objects;

/**
 * Settings of the linear SVM solver.
 *
 * @param c the cost of a margin violation (the inverse of the regularisation strength), &gt; 0
 * @param loss hinge or squared hinge
 * @param tolerance the solver stops when the spread of the projected dual gradient and 0,
 *     {@code max(PG, 0) - min(PG, 0)}, over one pass is at most this, &gt; 0
 * @param maxIterations the cap on passes over the data, &gt;= 1; a model that hit it records
 *     that it did not converge
 * @param bias the value of the constant feature appended to every row, &gt;= 0; its weight is
 *     learned and regularised like any other, and 0 means no bias term
 */
public record SvmConfig(double c, SvmLoss loss, double tolerance, int maxIterations, double bias) {

    public static final double DEFAULT_C = 1.0;
    public static final SvmLoss DEFAULT_LOSS = SvmLoss.SQUARED_HINGE;
    /**
     * 0.1, the customary default of dual coordinate descent: it reaches a model that predicts as
     * well as the exact optimum long before the dual gradient is small.
     */
    public static final double DEFAULT_TOLERANCE = 0.1;
    public static final int DEFAULT_MAX_ITERATIONS = 1000;
    public static final double DEFAULT_BIAS = 1.0;

    public SvmConfig {
        Objects.requireNonNull(loss, "loss");
        Checks.positive("c", c);
        Checks.positive("tolerance", tolerance);
        Checks.atLeastOne("maxIterations", maxIterations);
        Checks.nonNegative("bias", bias);
    }

    /** The defaults: c 1, squared hinge, tolerance 0.1, 1000 iterations, bias 1. */
    public static SvmConfig defaults() {
        return new SvmConfig(DEFAULT_C, DEFAULT_LOSS, DEFAULT_TOLERANCE, DEFAULT_MAX_ITERATIONS, DEFAULT_BIAS);
    }

    public SvmConfig withC(double newC) {
        return new SvmConfig(newC, loss, tolerance, maxIterations, bias);
    }

    public SvmConfig withLoss(SvmLoss newLoss) {
        return new SvmConfig(c, newLoss, tolerance, maxIterations, bias);
    }

    public SvmConfig withTolerance(double newTolerance) {
        return new SvmConfig(c, loss, newTolerance, maxIterations, bias);
    }

    public SvmConfig withMaxIterations(int newMaxIterations) {
        return new SvmConfig(c, loss, tolerance, newMaxIterations, bias);
    }

    public SvmConfig withBias(double newBias) {
        return new SvmConfig(c, loss, tolerance, maxIterations, newBias);
    }
}
