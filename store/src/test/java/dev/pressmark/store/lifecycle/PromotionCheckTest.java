package dev.pressmark.store.lifecycle;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import dev.pressmark.store.ShadowSummary;
import dev.pressmark.store.Version;
import java.time.Instant;
import java.util.List;
import java.util.Optional;
import java.util.TreeMap;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.constraints.DoubleRange;
import net.jqwik.api.constraints.IntRange;
import org.junit.jupiter.api.Test;

/** Hand-worked promotion decisions; every expected value below is worked out by hand from the numbers in the test. */
class PromotionCheckTest {

    private static final PromotionPolicy DEFAULTS = PromotionPolicy.defaults();

    private static Version version(String tag, String metricsJson) {
        return new Version("routing", tag, "0".repeat(64), 1, Instant.EPOCH, "{\"name\":\"routing\",\"metrics\":" + metricsJson + "}", false, false);
    }

    private static Version withTest(String tag, double balancedAccuracy) {
        return version(tag, "{\"test\":{\"accuracy\":0.5,\"balanced_accuracy\":" + balancedAccuracy + "}}");
    }

    private static ShadowSummary shadow(String candidate, long samples, long agreeing) {
        ShadowSummary empty = ShadowSummary.empty("1.0.0", candidate);
        return new ShadowSummary("1.0.0", candidate, ShadowSummary.SCORE, samples, 0, agreeing, new TreeMap<>(), empty.differenceCounts(), 0, 0);
    }

    @Test
    void a_candidate_six_points_below_the_active_is_refused_naming_the_metric_both_values_and_the_margin() {
        PromotionCheck.Outcome outcome = PromotionCheck.check(withTest("1.1.0", 0.85), Optional.of(withTest("1.0.0", 0.91)), Optional.empty(), DEFAULTS);
        assertThat(outcome.passed()).isFalse();
        PromotionCheck.Refusal refusal = outcome.refusals().get(0);
        assertThat(refusal.kind()).isEqualTo(PromotionCheck.METRIC_DROP);
        assertThat(refusal.source()).isEqualTo("test");
        assertThat(refusal.active()).isEqualTo(0.91);
        assertThat(refusal.candidate()).isEqualTo(0.85);
        assertThat(refusal.limit()).isEqualTo(0.02);
        // 0.91 - 0.85 = 0.06 in decimal
        assertThat(refusal.message()).contains("balanced_accuracy", "0.85", "0.91", "lower by 0.06", "0.02");
    }

    @Test
    void a_drop_of_exactly_the_margin_passes_though_binary_subtraction_would_make_it_larger() {
        // In binary doubles 0.90 - 0.88 is 0.020000000000000018, above 0.02; in decimal it is exactly 0.02, not more.
        assertThat(0.90 - 0.88).isGreaterThan(0.02);
        assertThat(PromotionCheck.check(withTest("1.1.0", 0.88), Optional.of(withTest("1.0.0", 0.90)), Optional.empty(), DEFAULTS).passed()).isTrue();
        assertThat(PromotionCheck.check(withTest("1.1.0", 0.879), Optional.of(withTest("1.0.0", 0.90)), Optional.empty(), DEFAULTS).passed()).isFalse();
    }

    @Test
    void a_better_or_equal_candidate_passes() {
        assertThat(PromotionCheck.check(withTest("1.1.0", 0.95), Optional.of(withTest("1.0.0", 0.90)), Optional.empty(), DEFAULTS).passed()).isTrue();
        assertThat(PromotionCheck.check(withTest("1.1.0", 0.90), Optional.of(withTest("1.0.0", 0.90)), Optional.empty(), DEFAULTS).passed()).isTrue();
    }

    @Test
    void without_test_metrics_on_both_sides_the_cross_validation_means_are_compared() {
        Version active = version("1.0.0", "{\"test\":{\"balanced_accuracy\":0.99},\"cv\":{\"balanced_accuracy\":{\"mean\":0.80,\"std_err\":0.01}}}");
        Version candidate = version("1.1.0", "{\"cv\":{\"balanced_accuracy\":{\"mean\":0.75,\"std_err\":0.01}}}");
        PromotionCheck.Outcome outcome = PromotionCheck.check(candidate, Optional.of(active), Optional.empty(), DEFAULTS);
        assertThat(outcome.refusals()).singleElement().satisfies(r -> {
            assertThat(r.source()).isEqualTo("cv");
            assertThat(r.active()).isEqualTo(0.80);
            assertThat(r.candidate()).isEqualTo(0.75);
            assertThat(r.message()).contains("cross-validation mean", "lower by 0.05");
        });
    }

    @Test
    void a_candidate_without_the_metric_is_refused_while_an_active_version_without_it_lets_any_candidate_pass() {
        Version bare = version("1.1.0", "{}");
        PromotionCheck.Outcome missing = PromotionCheck.check(bare, Optional.of(withTest("1.0.0", 0.9)), Optional.empty(), DEFAULTS);
        assertThat(missing.refusals()).singleElement().extracting(PromotionCheck.Refusal::kind).isEqualTo(PromotionCheck.METRIC_MISSING);

        PromotionCheck.Outcome nothingToCompare = PromotionCheck.check(withTest("1.1.0", 0.1), Optional.of(version("1.0.0", "{}")),
                Optional.empty(), DEFAULTS);
        assertThat(nothingToCompare.passed()).isTrue();
        assertThat(nothingToCompare.notes()).singleElement().asString().contains("records no balanced_accuracy");
    }

    @Test
    void the_first_activation_and_re_activating_the_active_version_pass() {
        assertThat(PromotionCheck.check(withTest("1.0.0", 0.1), Optional.empty(), Optional.empty(), DEFAULTS).passed()).isTrue();
        assertThat(PromotionCheck.check(withTest("1.0.0", 0.1), Optional.of(withTest("1.0.0", 0.1)), Optional.empty(), DEFAULTS).passed()).isTrue();
    }

    @Test
    void another_metric_and_margin_can_be_chosen() {
        Version active = version("1.0.0", "{\"test\":{\"balanced_accuracy\":0.9,\"f1\":0.80}}");
        Version candidate = version("1.1.0", "{\"test\":{\"balanced_accuracy\":0.5,\"f1\":0.75}}");
        PromotionPolicy f1 = DEFAULTS.withMetric("f1").withMaxDrop(0.05);
        // 0.80 - 0.75 = 0.05, not more than 0.05
        assertThat(PromotionCheck.check(candidate, Optional.of(active), Optional.empty(), f1).passed()).isTrue();
        assertThat(PromotionCheck.check(candidate, Optional.of(active), Optional.empty(), f1.withMaxDrop(0.04)).passed()).isFalse();
    }

    @Test
    void a_shadow_agreeing_too_rarely_is_refused_once_it_has_enough_items() {
        PromotionPolicy strict = DEFAULTS.withMinAgreement(0.9).withMinSamples(100);
        Version candidate = withTest("1.1.0", 0.95);
        Optional<Version> active = Optional.of(withTest("1.0.0", 0.90));
        // 170 of 200 = 0.85 < 0.9
        PromotionCheck.Outcome refused = PromotionCheck.check(candidate, active, Optional.of(shadow("1.1.0", 200, 170)), strict);
        assertThat(refused.refusals()).singleElement().satisfies(r -> {
            assertThat(r.kind()).isEqualTo(PromotionCheck.SHADOW_AGREEMENT);
            assertThat(r.candidate()).isEqualTo(0.85);
            assertThat(r.limit()).isEqualTo(0.9);
            assertThat(r.message()).contains("170 of 200", "0.85", "0.9");
        });
        // 180 of 200 = 0.9, not below
        assertThat(PromotionCheck.check(candidate, active, Optional.of(shadow("1.1.0", 200, 180)), strict).passed()).isTrue();
        // 99 items are too few to count
        PromotionCheck.Outcome tooFew = PromotionCheck.check(candidate, active, Optional.of(shadow("1.1.0", 99, 0)), strict);
        assertThat(tooFew.passed()).isTrue();
        assertThat(tooFew.notes()).anySatisfy(n -> assertThat(n).contains("99 items"));
        // the default minimum agreement, 0, is off
        assertThat(PromotionCheck.check(candidate, active, Optional.of(shadow("1.1.0", 200, 0)), DEFAULTS).passed()).isTrue();
        // a shadow of another candidate says nothing about this one
        assertThat(PromotionCheck.check(candidate, active, Optional.of(shadow("2.0.0", 200, 0)), strict).passed()).isTrue();
        // nor does one that compared it with a version no longer active
        assertThat(PromotionCheck.check(candidate, Optional.of(withTest("0.9.0", 0.90)), Optional.of(shadow("1.1.0", 200, 0)), strict).passed())
                .isTrue();
    }

    @Test
    void a_policy_out_of_bounds_is_refused_naming_the_field_and_bound() {
        assertThatThrownBy(() -> DEFAULTS.withMaxDrop(-0.1)).hasMessageContaining("maxDrop must be a finite number >= 0");
        assertThatThrownBy(() -> DEFAULTS.withMinAgreement(1.5)).hasMessageContaining("minAgreement must be in [0, 1]");
        assertThatThrownBy(() -> DEFAULTS.withMinSamples(0)).hasMessageContaining("minSamples must be >= 1");
        assertThatThrownBy(() -> DEFAULTS.withMetric("Balanced Accuracy")).hasMessageContaining("metric must be a manifest metric key");
    }

    @Property
    void never_refuses_when_the_candidates_metric_is_at_least_the_actives(@ForAll @DoubleRange(min = 0, max = 1) double active,
            @ForAll @DoubleRange(min = 0, max = 1) double extra, @ForAll @DoubleRange(min = 0, max = 0.5) double maxDrop) {
        double candidate = Math.min(1.0, active + extra);
        PromotionCheck.Outcome outcome = PromotionCheck.check(withTest("1.1.0", candidate), Optional.of(withTest("1.0.0", active)), Optional.empty(),
                DEFAULTS.withMaxDrop(maxDrop));
        assertThat(outcome.passed()).as("active %s, candidate %s, margin %s", active, candidate, maxDrop).isTrue();
    }

    @Property
    void on_values_in_thousandths_it_refuses_exactly_when_integer_arithmetic_says_the_drop_exceeds_the_margin(
            @ForAll @IntRange(min = 0, max = 1000) int active, @ForAll @IntRange(min = 0, max = 1000) int candidate,
            @ForAll @IntRange(min = 0, max = 100) int margin) {
        // the reference: exact integer thousandths, no floating point at all
        boolean expectRefusal = active - candidate > margin;
        PromotionCheck.Outcome outcome = PromotionCheck.check(withTest("1.1.0", candidate / 1000.0), Optional.of(withTest("1.0.0", active / 1000.0)),
                Optional.empty(), DEFAULTS.withMaxDrop(margin / 1000.0));
        assertThat(outcome.passed()).isEqualTo(!expectRefusal);
        assertThat(List.copyOf(outcome.refusals())).hasSize(expectRefusal ? 1 : 0);
    }
}
