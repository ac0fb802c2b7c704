package dev.pressmark.core.feature;

import java.util.Arrays;

/** The numeric loops of weighting and scaling, over primitive arrays. */
final class FeatureKernels {

    /** Counts below this take their sublinear weight from {@link #SUBLINEAR}. */
    private static final int SUBLINEAR_TABLE = 256;
    /** {@code 1 + ln c} for {@code c < SUBLINEAR_TABLE}, computed by the same {@link Math#log}, so the same bits. */
    private static final double[] SUBLINEAR = sublinearTable();

    private FeatureKernels() {
    }

    private static double[] sublinearTable() {
        double[] table = new double[SUBLINEAR_TABLE];
        for (int c = 1; c < SUBLINEAR_TABLE; c++) {
            table[c] = sublinear(c);
        }
        return table;
    }

    private static double sublinear(int count) {
        return 1.0 + Math.log(count);
    }

    /** {@code ln((1 + n) / (1 + df)) + 1}; see {@link Weighting#TFIDF}. */
    static double smoothIdf(int documentFrequency, int rows) {
        return Math.log((1.0 + rows) / (1.0 + documentFrequency)) + 1.0;
    }

    /**
     * Writes the weighted value of each of the {@code length} features {@code cols[k]} into
     * {@code vals[k]}, reading its occurrence count from {@code counts[cols[k]]} and setting that
     * count back to 0, so that the dense scratch is clean for the next row.
     *
     * <p>Most features of a short row occur once, so the weighted counts and their quotients by
     * the row's length repeat from feature to feature: the logarithms of small counts come from a
     * table, and a quotient is taken again only when the value before it differs. Every value is
     * still the same operation on the same operands, so the same bits.
     *
     * @param sublinear count {@code c} as {@code 1 + ln c} (scikit-learn's {@code sublinear_tf})
     * @param rowTokens the number of tokens in the row, selected or not; &gt; 0 whenever
     *     {@code length} is
     * @param idf the idf of every feature; read only for {@link Weighting#TFIDF}
     */
    static void weigh(Weighting weighting, boolean sublinear, int[] cols, int length, int[] counts, int rowTokens,
            double[] idf, double[] vals) {
        double tokens = rowTokens;
        for (int k = 0; k < length; k++) {
            int c = counts[cols[k]];
            vals[k] = !sublinear ? c : c < SUBLINEAR_TABLE ? SUBLINEAR[c] : sublinear(c);
        }
        switch (weighting) {
            case COUNT -> { }
            case TF -> dividePerValue(vals, length, tokens);
            case TFIDF -> {
                dividePerValue(vals, length, tokens);
                for (int k = 0; k < length; k++) {
                    vals[k] *= idf[cols[k]];
                }
            }
            case BINARY -> {
                for (int k = 0; k < length; k++) {
                    vals[k] = 1.0;
                }
            }
            default -> throw new IllegalArgumentException("unknown weighting " + weighting);
        }
        clear(counts, cols, length);
    }

    /**
     * {@code vals[k] /= tokens} for the first {@code length} entries, dividing only when the value
     * differs from the one before: the values are weighted counts, positive and finite, so equal
     * values are equal bits and give equal quotients.
     */
    private static void dividePerValue(double[] vals, int length, double tokens) {
        double last = Double.NaN;
        double quotient = Double.NaN;
        for (int k = 0; k < length; k++) {
            double v = vals[k];
            if (v != last) {
                last = v;
                quotient = v / tokens;
            }
            vals[k] = quotient;
        }
    }

    /** Sets {@code counts[cols[k]]} to 0 for the first {@code length} entries of {@code cols}. */
    static void clear(int[] counts, int[] cols, int length) {
        for (int k = 0; k < length; k++) {
            counts[cols[k]] = 0;
        }
    }

    /**
     * Divides {@code vals[0 .. length)} by their Euclidean norm; leaves an all-zero row as it is.
     * The norm is taken of the values divided by the largest magnitude, so that no square
     * overflows or underflows.
     */
    static void l2Normalize(double[] vals, int length) {
        double largest = 0.0;
        for (int k = 0; k < length; k++) {
            largest = Math.max(largest, Math.abs(vals[k]));
        }
        if (largest == 0.0) {
            return;
        }
        double sum = 0.0;
        for (int k = 0; k < length; k++) {
            double v = vals[k] / largest;
            sum += v * v;
        }
        double norm = largest * Math.sqrt(sum);
        for (int k = 0; k < length; k++) {
            vals[k] /= norm;
        }
    }

    /**
     * Multiplies each {@code vals[k]} by {@code factors[cols[k]]} and drops the entries that become
     * 0, keeping the order; returns the number of entries left.
     */
    static int scaleColumns(int[] cols, double[] vals, int length, double[] factors) {
        int kept = 0;
        for (int k = 0; k < length; k++) {
            double v = vals[k] * factors[cols[k]];
            if (v != 0.0) {
                cols[kept] = cols[k];
                vals[kept] = v;
                kept++;
            }
        }
        return kept;
    }

    /**
     * The mean and the population standard deviation (divisor {@code n}) of every column of
     * {@code x}, the rows that hold no entry for a column counting as 0. Two passes, the second
     * summing squared deviations from the mean, so that no large sums of squares cancel. A column
     * whose {@code n} values are all equal gets exactly its value as the mean and exactly 0 as the
     * deviation, which a rounded mean would not guarantee.
     */
    static void columnMoments(SparseMatrix x, double[] means, double[] standardDeviations) {
        int n = x.rows();
        int m = x.columns();
        int[] stored = new int[m];
        double[] smallest = new double[m];
        double[] largest = new double[m];
        double[] sums = new double[m];
        int entries = x.nonZeros();
        for (int k = 0; k < entries; k++) {
            int j = x.column(k);
            double v = x.value(k);
            if (stored[j]++ == 0) {
                smallest[j] = v;
                largest[j] = v;
            } else {
                smallest[j] = Math.min(smallest[j], v);
                largest[j] = Math.max(largest[j], v);
            }
            sums[j] += v;
        }
        for (int j = 0; j < m; j++) {
            means[j] = sums[j] / n;
        }
        double[] squares = sums;
        Arrays.fill(squares, 0.0);
        for (int k = 0; k < entries; k++) {
            int j = x.column(k);
            double d = x.value(k) - means[j];
            squares[j] += d * d;
        }
        for (int j = 0; j < m; j++) {
            boolean allEqual = stored[j] == 0
                    || smallest[j] == largest[j] && (stored[j] == n || smallest[j] == 0.0);
            if (allEqual) {
                means[j] = stored[j] == n ? smallest[j] : 0.0;
                standardDeviations[j] = 0.0;
            } else {
                double mean = means[j];
                standardDeviations[j] = Math.sqrt((squares[j] + (n - stored[j]) * mean * mean) / n);
            }
        }
    }

    /** {@code intercept + Σ weights[j] · scales[j] · means[j]}; see {@link FeatureSpace#centredIntercept}. */
    static double centredIntercept(double[] weights, double intercept, double[] means, double[] scales) {
        double sum = intercept;
        for (int j = 0; j < weights.length; j++) {
            sum += weights[j] * scales[j] * means[j];
        }
        return sum;
    }
}
