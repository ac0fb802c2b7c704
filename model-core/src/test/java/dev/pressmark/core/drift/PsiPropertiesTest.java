package dev.pressmark.core.drift;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.SplittableRandom;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.constraints.IntRange;
import smile.math.MathEx;

/**
 * Invariants of the index on random share vectors, and its identity with the J-divergence (the sum
 * of both Kullback-Leibler directions), cross-checked against Smile 3.1.1's
 * {@code MathEx.KullbackLeiblerDivergence} (com.github.haifengl:smile-base, GPL-3.0, test scope only).
 */
class PsiPropertiesTest {

    /** Both sides sum the same terms in a different grouping; beyond that no agreement is expected. */
    private static final double ROUNDING = 1e-12;

    private static double[] shares(SplittableRandom random, int bins, boolean allowEmpty) {
        long[] counts = new long[bins];
        for (int i = 0; i < bins; i++) {
            counts[i] = (allowEmpty ? 0 : 1) + random.nextInt(1_000);
        }
        return Psi.shares(counts);
    }

    @Property(tries = 300)
    void is_never_negative(@ForAll long seed, @ForAll @IntRange(min = 1, max = 40) int bins) {
        SplittableRandom random = new SplittableRandom(seed);
        assertThat(Psi.index(shares(random, bins, true), shares(random, bins, true))).isGreaterThanOrEqualTo(0.0);
    }

    @Property(tries = 300)
    void is_zero_between_a_distribution_and_itself(@ForAll long seed, @ForAll @IntRange(min = 1, max = 40) int bins) {
        double[] p = shares(new SplittableRandom(seed), bins, true);
        assertThat(Psi.index(p, p.clone())).isEqualTo(0.0);
    }

    @Property(tries = 300)
    void is_symmetric(@ForAll long seed, @ForAll @IntRange(min = 1, max = 40) int bins) {
        SplittableRandom random = new SplittableRandom(seed);
        double[] p = shares(random, bins, true);
        double[] q = shares(random, bins, true);
        assertThat(Psi.index(p, q)).isCloseTo(Psi.index(q, p), within(ROUNDING));
    }

    @Property(tries = 300)
    void equals_the_sum_of_both_kullback_leibler_divergences(@ForAll long seed, @ForAll @IntRange(min = 2, max = 40) int bins) {
        SplittableRandom random = new SplittableRandom(seed);
        double[] expected = shares(random, bins, false);
        double[] actual = shares(random, bins, false);
        // Smile, MathEx.KullbackLeiblerDivergence(x, y) = sum x ln(x / y), natural logarithm.
        double jDivergence = MathEx.KullbackLeiblerDivergence(actual, expected) + MathEx.KullbackLeiblerDivergence(expected, actual);
        assertThat(Psi.index(expected, actual)).isCloseTo(jDivergence, within(ROUNDING));
    }
}
