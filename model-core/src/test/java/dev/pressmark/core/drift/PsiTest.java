package dev.pressmark.core.drift;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import org.junit.jupiter.api.Test;

class PsiTest {

    /** The hand-worked totals below are rounded to seven places. */
    private static final double HAND_WORKED = 1e-7;

    @Test
    void matches_the_published_three_bin_income_example() {
        // GeeksforGeeks, "Population Stability Index (PSI)", last updated 13 Aug 2025: income levels,
        // expected (2020) low 0.4, medium 0.3, high 0.3 against observed (2021) 0.35, 0.25, 0.4.
        // The bin values are read from that page; the total is worked here by hand:
        // 0.05 * ln(0.4/0.35) + 0.05 * ln(0.3/0.25) + 0.1 * ln(0.4/0.3) = 0.0066766 + 0.0091161 + 0.0287682.
        double psi = Psi.index(new double[] {0.4, 0.3, 0.3}, new double[] {0.35, 0.25, 0.4});
        assertThat(psi).isCloseTo(0.0445609, within(HAND_WORKED));
    }

    @Test
    void an_empty_bin_counts_as_the_floor_share() {
        // Worked by hand: (1 - 0.5) ln(1 / 0.5) + (0.0001 - 0.5) ln(0.0001 / 0.5) = 0.3465736 + 4.2577448.
        double psi = Psi.index(new double[] {0.5, 0.5}, new double[] {1.0, 0.0});
        assertThat(psi).isCloseTo(4.6043185, within(HAND_WORKED));
    }

    @Test
    void shares_divide_counts_by_their_total_and_an_empty_total_gives_zeros() {
        assertThat(Psi.shares(new long[] {1, 3, 0})).containsExactly(0.25, 0.75, 0.0);
        assertThat(Psi.shares(new long[] {0, 0})).containsExactly(0.0, 0.0);
    }

    @Test
    void refuses_bins_that_do_not_line_up_or_are_not_shares() {
        assertThatThrownBy(() -> Psi.index(new double[] {0.5, 0.5}, new double[] {1.0}))
                .isInstanceOf(IllegalArgumentException.class).hasMessageContaining("2 expected bins but 1 actual");
        assertThatThrownBy(() -> Psi.index(new double[0], new double[0]))
                .isInstanceOf(IllegalArgumentException.class).hasMessageContaining("at least one bin");
        assertThatThrownBy(() -> Psi.index(new double[] {0.5, Double.NaN}, new double[] {0.5, 0.5}))
                .isInstanceOf(IllegalArgumentException.class).hasMessageContaining("expected[1] must be a share in [0, 1], was NaN");
        assertThatThrownBy(() -> Psi.index(new double[] {0.5, 0.5}, new double[] {-0.1, 1.1}))
                .isInstanceOf(IllegalArgumentException.class).hasMessageContaining("actual[0] must be a share in [0, 1], was -0.1");
        assertThatThrownBy(() -> Psi.shares(new long[] {2, -1}))
                .isInstanceOf(IllegalArgumentException.class).hasMessageContaining("counts[1] must be >= 0, was -1");
    }

    @Test
    void the_status_follows_the_common_thresholds() {
        assertThat(DriftStatus.of(0.0)).isEqualTo(DriftStatus.OK);
        assertThat(DriftStatus.of(0.0999)).isEqualTo(DriftStatus.OK);
        assertThat(DriftStatus.of(0.1)).isEqualTo(DriftStatus.WATCH);
        assertThat(DriftStatus.of(0.25)).isEqualTo(DriftStatus.WATCH);
        assertThat(DriftStatus.of(0.2501)).isEqualTo(DriftStatus.DRIFT);
        assertThat(DriftStatus.DRIFT.key()).isEqualTo("drift");
    }
}
