package dev.pressmark.core.drift;

/**
 * The population stability index of two binned distributions, {@code sum (a_i - e_i) ln(a_i / e_i)}
 * over the bins, with {@code e} the expected (training) shares and {@code a} the actual (live)
 * ones. It equals the J-divergence of Jeffreys (1946), {@code KL(a || e) + KL(e || a)}, so it is
 * never negative, zero only for equal shares, and symmetric. See N. Siddiqi, <i>Credit Risk
 * Scorecards</i>, Wiley 2006, and B. Yurdakul, <i>Statistical Properties of Population Stability
 * Index</i>, PhD thesis, Western Michigan University 2018.
 */
public final class Psi {

    /**
     * The share an empty bin counts as, so that its logarithm is finite. Replacing a zero share with
     * a small constant such as 0.0001 is common practice; the shares are not renormalised after.
     */
    public static final double EMPTY_SHARE = 1e-4;

    private Psi() {
    }

    /** The index of {@code actual} against {@code expected}; both are shares in [0, 1], one per bin. */
    public static double index(double[] expected, double[] actual) {
        if (expected.length != actual.length) {
            throw new IllegalArgumentException(expected.length + " expected bins but " + actual.length + " actual bins");
        }
        if (expected.length == 0) {
            throw new IllegalArgumentException("the index needs at least one bin");
        }
        double sum = 0.0;
        for (int i = 0; i < expected.length; i++) {
            double e = floored("expected", i, expected[i]);
            double a = floored("actual", i, actual[i]);
            sum += (a - e) * Math.log(a / e);
        }
        return sum;
    }

    /** Each count over their total; all zeros when the total is zero. */
    public static double[] shares(long[] counts) {
        long total = 0;
        for (int i = 0; i < counts.length; i++) {
            if (counts[i] < 0) {
                throw new IllegalArgumentException("counts[" + i + "] must be >= 0, was " + counts[i]);
            }
            total += counts[i];
        }
        double[] shares = new double[counts.length];
        if (total > 0) {
            for (int i = 0; i < counts.length; i++) {
                shares[i] = (double) counts[i] / total;
            }
        }
        return shares;
    }

    private static double floored(String side, int i, double share) {
        if (!(share >= 0.0 && share <= 1.0)) {
            throw new IllegalArgumentException(side + "[" + i + "] must be a share in [0, 1], was " + share);
        }
        return share == 0.0 ? EMPTY_SHARE : share;
    }
}
