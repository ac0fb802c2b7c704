package dev.pressmark.core.classify;

import java.util.ArrayList;
import java.util.List;

/**
 * A sigmoid that maps a decision value {@code f} to a probability of the positive class,
 * {@code P(positive | f) = 1 / (1 + exp(a·f + b))}: J. Platt, "Probabilistic outputs for support
 * vector machines and comparisons to regularized likelihood methods", in Advances in Large Margin
 * Classifiers, MIT Press, 1999.
 *
 * <p>{@link #fit(double[], boolean[])} follows H.-T. Lin, C.-J. Lin and R. C. Weng, "A note on
 * Platt's probabilistic outputs for support vector machines", Machine Learning 68, 2007: it
 * minimises the cross-entropy against Platt's smoothed targets, {@code (N+ + 1) / (N+ + 2)} for
 * positives and {@code 1 / (N- + 2)} for negatives,
 * <pre>  min_{a,b} Σ_i −t_i log p_i − (1 − t_i) log(1 − p_i),  p_i = 1 / (1 + exp(a f_i + b))</pre>
 * by Newton's method on a slightly ridged Hessian with a backtracking (Armijo) line search, each
 * term evaluated in a form that cannot overflow. Fit it on decision values the model did not
 * train on (out-of-fold), or it is overconfident.
 *
 * <p>With case weights {@code w_i}, each term of the sum is multiplied by {@code w_i} and the
 * counts {@code N+} and {@code N-} in the targets become sums of weights, so that a row of integer
 * weight {@code w} counts as {@code w} copies of it and a row of weight 0 not at all.
 *
 * @param a the slope, negative when larger decision values mean more likely positive
 * @param b the offset
 */
public record PlattScaling(double a, double b) {

    private static final int MAX_ITERATIONS = 100;
    /** The backtracking gives up below this step length, keeping the last accepted point. */
    private static final double MIN_STEP = 1e-10;
    /** Added to the Hessian's diagonal so it stays positive definite on separable data. */
    private static final double HESSIAN_RIDGE = 1e-12;
    /** Newton stops when both partial derivatives are below this. */
    private static final double GRADIENT_TOLERANCE = 1e-5;
    /** The sufficient-decrease constant of the line search. */
    private static final double ARMIJO = 1e-4;

    public PlattScaling {
        if (!Double.isFinite(a) || !Double.isFinite(b)) {
            throw new IllegalArgumentException("a and b must be finite, were " + a + " and " + b);
        }
    }

    /** Fits the sigmoid to decision values and whether each example is positive. */
    public static PlattScaling fit(double[] decisionValues, boolean[] positive) {
        return fit(decisionValues, positive, null);
    }

    /**
     * Fits the sigmoid to decision values and whether each example is positive, each example
     * counting its case weight (the weighted negative log-likelihood).
     *
     * @param weights one finite weight {@code >= 0} per example, or {@code null} for all 1
     */
    public static PlattScaling fit(double[] decisionValues, boolean[] positive, double[] weights) {
        double[] f = decisionValues;
        if (f.length != positive.length) {
            throw new IllegalArgumentException("decisionValues and positive must have the same length, had "
                    + f.length + " and " + positive.length);
        }
        if (f.length == 0) {
            throw new IllegalArgumentException("decisionValues must hold at least one value, was empty");
        }
        double[] w = checkedWeights(weights, f.length);
        double positives = 0.0;
        double negatives = 0.0;
        for (int i = 0; i < f.length; i++) {
            if (!Double.isFinite(f[i])) {
                throw new IllegalArgumentException("decisionValues[" + i + "] must be finite, was " + f[i]);
            }
            positives += positive[i] ? w[i] : 0.0;
            negatives += positive[i] ? 0.0 : w[i];
        }
        double[] t = targets(positive, w);
        double a = 0.0;
        double b = Math.log((negatives + 1.0) / (positives + 1.0));
        double value = loss(f, t, w, a, b);
        for (int iteration = 0; iteration < MAX_ITERATIONS; iteration++) {
            double h11 = HESSIAN_RIDGE;
            double h22 = HESSIAN_RIDGE;
            double h21 = 0.0;
            double g1 = 0.0;
            double g2 = 0.0;
            for (int i = 0; i < f.length; i++) {
                double z = f[i] * a + b;
                double p = Logistic.sigmoid(-z);
                double q = Logistic.sigmoid(z);
                double d2 = w[i] * p * q;
                h11 += f[i] * f[i] * d2;
                h22 += d2;
                h21 += f[i] * d2;
                double d1 = w[i] * (t[i] - p);
                g1 += f[i] * d1;
                g2 += d1;
            }
            if (Math.abs(g1) < GRADIENT_TOLERANCE && Math.abs(g2) < GRADIENT_TOLERANCE) {
                break;
            }
            double det = h11 * h22 - h21 * h21;
            double da = -(h22 * g1 - h21 * g2) / det;
            double db = -(-h21 * g1 + h11 * g2) / det;
            double slope = g1 * da + g2 * db;
            double step = 1.0;
            while (step >= MIN_STEP) {
                double newA = a + step * da;
                double newB = b + step * db;
                double newValue = loss(f, t, w, newA, newB);
                if (newValue < value + ARMIJO * step * slope) {
                    a = newA;
                    b = newB;
                    value = newValue;
                    break;
                }
                step *= 0.5;
            }
            if (step < MIN_STEP) {
                break;
            }
        }
        return new PlattScaling(a, b);
    }

    /**
     * One sigmoid per score of a model from decision values {@code decisionValues[score][row]}
     * (typically out-of-fold): for a binary model the positive class is 1, for one versus rest
     * score {@code k}'s positive class is {@code k}.
     */
    public static List<PlattScaling> fitScores(double[][] decisionValues, int[] labels, int numClasses) {
        return fitScores(decisionValues, labels, null, numClasses);
    }

    /**
     * As {@link #fitScores(double[][], int[], int)}, each row counting its case weight.
     *
     * @param weights one finite weight {@code >= 0} per row, or {@code null} for all 1
     */
    public static List<PlattScaling> fitScores(double[][] decisionValues, int[] labels, double[] weights, int numClasses) {
        int[] positiveClasses = OneVsRest.positiveClasses(numClasses);
        if (decisionValues.length != positiveClasses.length) {
            throw new IllegalArgumentException("decisionValues must have " + positiveClasses.length + " scores for "
                    + numClasses + " classes, had " + decisionValues.length);
        }
        List<PlattScaling> scalings = new ArrayList<>(positiveClasses.length);
        boolean[] positive = new boolean[labels.length];
        for (int k = 0; k < positiveClasses.length; k++) {
            for (int i = 0; i < labels.length; i++) {
                positive[i] = Labels.check(labels[i], numClasses) == positiveClasses[k];
            }
            scalings.add(fit(decisionValues[k], positive, weights));
        }
        return scalings;
    }

    /** {@code P(positive | f)}, without overflow for any finite {@code f}. */
    public double probability(double decisionValue) {
        return Logistic.sigmoid(logit(decisionValue));
    }

    /** {@code −(a·f + b)}, the log-odds of the positive class. */
    double logit(double decisionValue) {
        return -(a * decisionValue + b);
    }

    /** Platt's smoothed targets. */
    static double[] targets(boolean[] positive) {
        double[] ones = new double[positive.length];
        java.util.Arrays.fill(ones, 1.0);
        return targets(positive, ones);
    }

    /** Platt's smoothed targets, {@code N+} and {@code N-} the sums of the weights of each side. */
    static double[] targets(boolean[] positive, double[] weights) {
        double positives = 0.0;
        double negatives = 0.0;
        for (int i = 0; i < positive.length; i++) {
            positives += positive[i] ? weights[i] : 0.0;
            negatives += positive[i] ? 0.0 : weights[i];
        }
        double high = (positives + 1.0) / (positives + 2.0);
        double low = 1.0 / (negatives + 2.0);
        double[] t = new double[positive.length];
        for (int i = 0; i < t.length; i++) {
            t[i] = positive[i] ? high : low;
        }
        return t;
    }

    /** The cross-entropy against targets {@code t}, each term in the branch that cannot overflow. */
    static double loss(double[] f, double[] t, double a, double b) {
        return loss(f, t, checkedWeights(null, f.length), a, b);
    }

    /** The cross-entropy against targets {@code t}, term {@code i} weighted by {@code w[i]}. */
    static double loss(double[] f, double[] t, double[] w, double a, double b) {
        double sum = 0.0;
        for (int i = 0; i < f.length; i++) {
            if (w[i] == 0.0) {
                continue;
            }
            double z = f[i] * a + b;
            sum += w[i] * (z >= 0.0 ? t[i] * z + Math.log1p(Math.exp(-z)) : (t[i] - 1.0) * z + Math.log1p(Math.exp(z)));
        }
        return sum;
    }

    /** {@code weights} checked (one finite value {@code >= 0} per example), or all 1 for {@code null}. */
    private static double[] checkedWeights(double[] weights, int n) {
        if (weights == null) {
            double[] ones = new double[n];
            java.util.Arrays.fill(ones, 1.0);
            return ones;
        }
        if (weights.length != n) {
            throw new IllegalArgumentException("weights must have one entry per example (" + n + "), had " + weights.length);
        }
        for (int i = 0; i < n; i++) {
            if (!(weights[i] >= 0.0) || Double.isInfinite(weights[i])) {
                throw new IllegalArgumentException("weights[" + i + "] must be a finite number >= 0, was " + weights[i]);
            }
        }
        return weights;
    }
}
