package dev.pressmark.core.classify;

/**
 * Settings of the logistic regression solver.
 *
 * @param c the weight of the log loss against the regulariser, &gt; 0
 * @param tolerance the solver stops when the largest magnitude of the dual gradient over one pass
 *     is below this, &gt; 0
 * @param maxIterations the cap on passes over the data, &gt;= 1; a model that hit it records
 *     that it did not converge
 * @param bias the value of the constant feature appended to every row, &gt;= 0; its weight is
 *     learned and regularised like any other, and 0 means no bias term
 */
public record LogisticConfig(double c, double tolerance, int maxIterations, double bias) {

    public static final double DEFAULT_C = 1.0;
    /** 0.1, the customary default of dual coordinate descent; see {@link SvmConfig#DEFAULT_TOLERANCE}. */
    public static final double DEFAULT_TOLERANCE = 0.1;
    public static final int DEFAULT_MAX_ITERATIONS = 1000;
    public static final double DEFAULT_BIAS = 1.0;

    public LogisticConfig {
        Checks.positive("c", c);
        Checks.positive("tolerance", tolerance);
        Checks.atLeastOne("maxIterations", maxIterations);
        Checks.nonNegative("bias", bias);
    }

    /** The defaults: c 1, tolerance 0.1, 1000 iterations, bias 1. */
    public static LogisticConfig defaults() {
        return new LogisticConfig(DEFAULT_C, DEFAULT_TOLERANCE, DEFAULT_MAX_ITERATIONS, DEFAULT_BIAS);
    }

    public LogisticConfig withC(double newC) {
        return new LogisticConfig(newC, tolerance, maxIterations, bias);
    }

    public LogisticConfig withTolerance(double newTolerance) {
        return new LogisticConfig(c, newTolerance, maxIterations, bias);
    }

    public LogisticConfig withMaxIterations(int newMaxIterations) {
        return new LogisticConfig(c, tolerance, newMaxIterations, bias);
    }

    public LogisticConfig withBias(double newBias) {
        return new LogisticConfig(c, tolerance, maxIterations, newBias);
    }
}
