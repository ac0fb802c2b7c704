package dev.pressmark.core.feature;

import static org.assertj.core.api.Assertions.assertThat;

import java.util.SplittableRandom;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.constraints.IntRange;

/**
 * The weighting kernel gives, bit for bit, the textbook formulas written out directly: {@code c} or
 * {@code 1 + ln c} (scikit-learn's {@code sublinear_tf}), divided by the row's token count, times
 * the idf; its table of logarithms and its reuse of equal quotients change no bit.
 */
class FeatureKernelsWeighTest {

    @Property(tries = 300)
    void weighs_every_count_as_the_formula_does_bit_for_bit(@ForAll boolean sublinear,
            @ForAll @IntRange(min = 0, max = 200) int length, @ForAll long seed) {
        SplittableRandom random = new SplittableRandom(seed);
        int features = 1_000;
        int[] cols = random.ints(0, features).distinct().limit(length).toArray();
        int[] counts = new int[features];
        double[] idf = new double[features];
        int rowTokens = 0;
        for (int j = 0; j < features; j++) {
            idf[j] = 1.0 + random.nextDouble() * 8.0;
        }
        for (int col : cols) {
            // mostly 1, some small repeats, some past the table of logarithms
            counts[col] = random.nextInt(4) > 0 ? 1 : random.nextBoolean() ? 2 + random.nextInt(5) : 200 + random.nextInt(400);
            rowTokens += counts[col];
        }
        rowTokens += random.nextInt(10);
        for (Weighting weighting : Weighting.values()) {
            int[] scratch = counts.clone();
            double[] vals = new double[features];
            FeatureKernels.weigh(weighting, sublinear, cols, cols.length, scratch, rowTokens, idf, vals);
            for (int k = 0; k < cols.length; k++) {
                int c = counts[cols[k]];
                double v = sublinear ? 1.0 + Math.log(c) : c;
                double expected = switch (weighting) {
                    case COUNT -> v;
                    case TF -> v / rowTokens;
                    case TFIDF -> v / rowTokens * idf[cols[k]];
                    case BINARY -> 1.0;
                };
                assertThat(Double.doubleToRawLongBits(vals[k])).as("%s, count %d", weighting, c)
                        .isEqualTo(Double.doubleToRawLongBits(expected));
                assertThat(scratch[cols[k]]).as("the count is cleared").isZero();
            }
        }
    }
}
