package dev.pressmark.core.classify;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.Arrays;
import java.util.SplittableRandom;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.constraints.IntRange;

/**
 * Weighted Platt scaling against its defining identity: with integer case weights, the weighted
 * negative log-likelihood (and Platt's targets, whose counts become sums of weights) is the
 * unweighted one over the rows repeated, so both fits reach the same sigmoid; weight 0 is absence.
 * The sums are those of Platt (1999) and Lin, Lin and Weng (Machine Learning 68, 2007) with each
 * row repeated {@code w_i} times.
 */
class PlattScalingWeightsTest {

    /**
     * Both fits stop at a gradient of 1e-5 on the same loss, reached through iterates that differ
     * only by summation order, so they agree to far better than this.
     */
    private static final double PARAMETER = 1e-6;

    @Property(tries = 200)
    void an_integer_weight_w_fits_as_w_copies_of_the_row(@ForAll long seed, @ForAll @IntRange(min = 2, max = 50) int n) {
        SplittableRandom random = new SplittableRandom(seed);
        double shift = random.nextDouble(-3.0, 3.0);
        double[] f = new double[n];
        boolean[] positive = new boolean[n];
        double[] weights = new double[n];
        int total = 0;
        for (int i = 0; i < n; i++) {
            positive[i] = random.nextBoolean();
            f[i] = (positive[i] ? shift : 0.0) + random.nextGaussian();
            weights[i] = random.nextInt(4);
            total += (int) weights[i];
        }
        if (total == 0) {
            weights[0] = 1.0;
            total = 1;
        }
        double[] repeatedF = new double[total];
        boolean[] repeatedPositive = new boolean[total];
        int next = 0;
        for (int i = 0; i < n; i++) {
            for (int r = 0; r < (int) weights[i]; r++) {
                repeatedF[next] = f[i];
                repeatedPositive[next++] = positive[i];
            }
        }

        PlattScaling weighted = PlattScaling.fit(f, positive, weights);
        PlattScaling repeated = PlattScaling.fit(repeatedF, repeatedPositive);

        assertThat(weighted.a()).isCloseTo(repeated.a(), within(PARAMETER * (1.0 + Math.abs(repeated.a()))));
        assertThat(weighted.b()).isCloseTo(repeated.b(), within(PARAMETER * (1.0 + Math.abs(repeated.b()))));
    }

    @Property(tries = 50)
    void weights_of_1_change_nothing(@ForAll long seed, @ForAll @IntRange(min = 1, max = 40) int n) {
        SplittableRandom random = new SplittableRandom(seed);
        double[] f = new double[n];
        boolean[] positive = new boolean[n];
        for (int i = 0; i < n; i++) {
            positive[i] = random.nextBoolean();
            f[i] = random.nextGaussian() + (positive[i] ? 1.0 : 0.0);
        }
        double[] ones = new double[n];
        Arrays.fill(ones, 1.0);
        assertThat(PlattScaling.fit(f, positive, ones)).isEqualTo(PlattScaling.fit(f, positive));
    }

    @Property(tries = 5)
    void a_negative_or_infinite_weight_is_refused(@ForAll @IntRange(min = 0, max = 1) int which) {
        double[] weights = {1.0, which == 0 ? -1.0 : Double.POSITIVE_INFINITY};
        org.assertj.core.api.Assertions.assertThatThrownBy(
                () -> PlattScaling.fit(new double[] {0.5, -0.5}, new boolean[] {true, false}, weights))
                .hasMessageContaining("weights[1]");
    }
}
