package dev.pressmark.store;

import static org.assertj.core.api.Assertions.assertThat;

import java.util.List;
import java.util.Map;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.constraints.DoubleRange;
import net.jqwik.api.constraints.Size;
import org.apache.commons.math3.stat.descriptive.rank.Percentile;
import org.junit.jupiter.api.Test;

class ShadowSummaryTest {

    @Test
    void a_tally_of_four_hand_counted_items_gives_their_agreement_table_mean_and_bins() {
        ShadowSummary.Tally tally = new ShadowSummary.Tally("1.0.0", "1.1.0");
        tally.add("garden", "garden", 0.004, ShadowSummary.PROBABILITY);
        tally.add("garden", "plumbing", -0.3, ShadowSummary.PROBABILITY);
        tally.add("plumbing", "plumbing", 0.02, ShadowSummary.PROBABILITY);
        tally.add("plumbing", "plumbing", 0.0, ShadowSummary.PROBABILITY);
        tally.dropped(5);
        ShadowSummary s = tally.summary();
        assertThat(s.samples()).isEqualTo(4);
        assertThat(s.dropped()).isEqualTo(5);
        assertThat(s.agreeing()).isEqualTo(3);
        assertThat(s.agreement()).isEqualTo(0.75);
        assertThat(s.labels()).isEqualTo(Map.of("garden", Map.of("garden", 1L, "plumbing", 1L), "plumbing", Map.of("plumbing", 2L)));
        // (0.004 - 0.3 + 0.02 + 0) / 4 = -0.069
        assertThat(s.meanDifference()).isCloseTo(-0.069, org.assertj.core.data.Offset.offset(1e-15));
        assertThat(s.maxAbsDifference()).isEqualTo(0.3);
        // |d| = 0 -> bin <= 0.001; 0.004 -> <= 0.005; 0.02 -> <= 0.02 (edges are inclusive); 0.3 -> <= 0.5
        assertThat(s.differenceCounts()).containsExactly(1L, 0L, 1L, 0L, 1L, 0L, 0L, 0L, 1L, 0L, 0L, 0L, 0L, 0L);
        // ranks: p50 -> 2nd smallest (0.004, bin edge 0.005); p90 and p99 -> 4th (0.3, edge 0.5, capped at the largest 0.3)
        assertThat(s.absDifferenceQuantile(0.5)).isEqualTo(0.005);
        assertThat(s.absDifferenceQuantile(0.9)).isEqualTo(0.3);
        assertThat(s.basis()).isEqualTo(ShadowSummary.PROBABILITY);
    }

    @Test
    void an_empty_summary_has_no_agreement_and_no_quantiles() {
        ShadowSummary s = ShadowSummary.empty("a", "b");
        assertThat(s.agreement()).isNaN();
        assertThat(s.absDifferenceQuantile(0.5)).isNaN();
        assertThat(s.toJson().get("agreement").isNull()).isTrue();
    }

    @Property
    void each_quantile_is_the_bin_edge_at_or_above_the_reference_percentile(
            @ForAll @Size(min = 1, max = 300) List<@DoubleRange(min = -20, max = 20) Double> differences,
            @ForAll @DoubleRange(min = 0.01, max = 1.0) double q) {
        ShadowSummary.Tally tally = new ShadowSummary.Tally("a", "b");
        double[] abs = new double[differences.size()];
        for (int i = 0; i < abs.length; i++) {
            tally.add("x", "x", differences.get(i), ShadowSummary.SCORE);
            abs[i] = Math.abs(differences.get(i));
        }
        ShadowSummary s = tally.summary();
        // Apache Commons Math's R-1 estimate is the inverse of the empirical distribution: the nearest-rank quantile
        double reference = new Percentile().withEstimationType(Percentile.EstimationType.R_1).evaluate(abs, q * 100);
        double max = java.util.Arrays.stream(abs).max().orElseThrow();
        double expected = max;
        for (double edge : ShadowSummary.DIFFERENCE_BOUNDS) {
            if (reference <= edge) {
                expected = Math.min(edge, max);
                break;
            }
        }
        assertThat(s.absDifferenceQuantile(q)).isEqualTo(expected).isGreaterThanOrEqualTo(reference);
    }

    @Property
    void two_replicas_summaries_add_up_to_the_summary_of_all_their_items(
            @ForAll @Size(max = 50) List<@DoubleRange(min = -3, max = 3) Double> first,
            @ForAll @Size(max = 50) List<@DoubleRange(min = -3, max = 3) Double> second) {
        ShadowSummary.Tally a = new ShadowSummary.Tally("1", "2");
        ShadowSummary.Tally b = new ShadowSummary.Tally("1", "2");
        ShadowSummary.Tally all = new ShadowSummary.Tally("1", "2");
        for (int i = 0; i < first.size(); i++) {
            String label = i % 3 == 0 ? "p" : "q";
            a.add("p", label, first.get(i), ShadowSummary.SCORE);
            all.add("p", label, first.get(i), ShadowSummary.SCORE);
        }
        for (int i = 0; i < second.size(); i++) {
            b.add("q", "q", second.get(i), ShadowSummary.SCORE);
            all.add("q", "q", second.get(i), ShadowSummary.SCORE);
        }
        ShadowSummary merged = a.summary().plus(b.summary());
        ShadowSummary expected = all.summary();
        assertThat(merged.samples()).isEqualTo(expected.samples());
        assertThat(merged.agreeing()).isEqualTo(expected.agreeing());
        assertThat(merged.labels()).isEqualTo(expected.labels());
        assertThat(merged.differenceCounts()).isEqualTo(expected.differenceCounts());
        assertThat(merged.maxAbsDifference()).isEqualTo(expected.maxAbsDifference());
    }

    @Test
    void the_json_form_reads_back_to_the_same_summary() {
        ShadowSummary.Tally tally = new ShadowSummary.Tally("1.0.0", "1.1.0");
        tally.add("garden", "plumbing", 0.25, ShadowSummary.SCORE);
        tally.add("plumbing", "plumbing", -1.5, ShadowSummary.SCORE);
        tally.dropped(2);
        ShadowSummary s = tally.summary();
        assertThat(ShadowSummary.fromJson(s.toJson().toString())).isEqualTo(s);
    }
}
