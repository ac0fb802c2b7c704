package dev.pressmark.core.classify;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import java.util.SplittableRandom;
import java.util.function.DoubleUnaryOperator;
import org.junit.jupiter.api.Test;

/**
 * Platt scaling against the problem it solves (Platt 1999; Lin, Lin and Weng, Machine Learning
 * 68, 2007): the smoothed cross-entropy, checked by finite differences and by an independent
 * brute-force minimisation.
 */
class PlattScalingTest {

    /** The fit stops when both partial derivatives are below 1e-5; allow for the difference quotient. */
    private static final double GRADIENT = 1e-4;
    private static final double STEP = 1e-5;
    /** Golden-section search brackets the minimiser to this. */
    private static final double SEARCH = 1e-9;
    /** Two minimisers of the same smooth convex function agree to about the square root of its flatness. */
    private static final double PARAMETER = 1e-3;

    @Test
    void the_fit_zeroes_the_gradient_of_the_smoothed_log_loss() {
        SplittableRandom random = new SplittableRandom(17L);
        int n = 400;
        double[] f = new double[n];
        boolean[] positive = new boolean[n];
        for (int i = 0; i < n; i++) {
            positive[i] = random.nextDouble() < 0.3;
            f[i] = (positive[i] ? 0.8 : -1.1) + random.nextGaussian();
        }

        PlattScaling fit = PlattScaling.fit(f, positive);

        double[] t = PlattScaling.targets(positive);
        double a = fit.a();
        double b = fit.b();
        double da = (PlattScaling.loss(f, t, a + STEP, b) - PlattScaling.loss(f, t, a - STEP, b)) / (2 * STEP);
        double db = (PlattScaling.loss(f, t, a, b + STEP) - PlattScaling.loss(f, t, a, b - STEP)) / (2 * STEP);
        assertThat(da).isCloseTo(0.0, within(GRADIENT));
        assertThat(db).isCloseTo(0.0, within(GRADIENT));
        assertThat(a).as("larger decision values mean more likely positive").isNegative();
    }

    @Test
    void the_targets_are_platts_smoothed_ones() {
        // Platt (1999): (N+ + 1)/(N+ + 2) for positives, 1/(N- + 2) for negatives.
        double[] t = PlattScaling.targets(new boolean[] {true, false, false, true, false});

        assertThat(t).containsExactly(3.0 / 4.0, 1.0 / 5.0, 1.0 / 5.0, 3.0 / 4.0, 1.0 / 5.0);
    }

    @Test
    void the_fit_on_a_separable_toy_set_matches_a_brute_force_minimisation() {
        double[] f = {-3, -2, -1.5, -1, 0.5, 1, 2, 3, 4};
        boolean[] positive = {false, false, false, false, true, true, true, true, true};
        double[] t = PlattScaling.targets(positive);

        PlattScaling fit = PlattScaling.fit(f, positive);

        // Independent: the loss is jointly convex, so min_b loss(a, b) is convex in a; a grid
        // brackets a, and nested golden-section searches find the minimiser.
        DoubleUnaryOperator bestOverB = a -> PlattScaling.loss(f, t, a, goldenSection(b -> PlattScaling.loss(f, t, a, b),
                -20.0, 20.0));
        double gridA = 0.0;
        double gridValue = Double.POSITIVE_INFINITY;
        for (double a = -20.0; a <= 0.0; a += 0.05) {
            double value = bestOverB.applyAsDouble(a);
            if (value < gridValue) {
                gridValue = value;
                gridA = a;
            }
        }
        double bruteA = goldenSection(bestOverB, gridA - 0.05, gridA + 0.05);
        double bruteB = goldenSection(b -> PlattScaling.loss(f, t, bruteA, b), -20.0, 20.0);

        assertThat(fit.a()).isCloseTo(bruteA, within(PARAMETER));
        assertThat(fit.b()).isCloseTo(bruteB, within(PARAMETER));
        assertThat(PlattScaling.loss(f, t, fit.a(), fit.b()))
                .isLessThanOrEqualTo(PlattScaling.loss(f, t, bruteA, bruteB) + SEARCH);
    }

    @Test
    void a_symmetric_set_gets_no_offset() {
        // With f and the labels mirror images and N+ = N-, the smoothed targets are mirror images
        // too (t- = 1 − t+), so the loss is symmetric under b → −b and its minimiser has b = 0.
        double[] f = {-2, -1, -0.5, 0.3, -0.3, 0.5, 1, 2};
        boolean[] positive = {false, false, false, false, true, true, true, true};

        PlattScaling fit = PlattScaling.fit(f, positive);

        assertThat(fit.b()).isCloseTo(0.0, within(1e-6));
        assertThat(fit.probability(0.0)).isCloseTo(0.5, within(1e-6));
    }

    @Test
    void decision_values_near_a_thousand_neither_overflow_nor_change_the_fitted_shape() {
        SplittableRandom random = new SplittableRandom(3L);
        int n = 200;
        double[] small = new double[n];
        double[] large = new double[n];
        boolean[] positive = new boolean[n];
        for (int i = 0; i < n; i++) {
            positive[i] = i % 2 == 0;
            small[i] = (positive[i] ? 1.0 : -1.0) + 0.6 * random.nextGaussian();
            large[i] = 1000.0 * small[i];
        }

        PlattScaling fitSmall = PlattScaling.fit(small, positive);
        PlattScaling fitLarge = PlattScaling.fit(large, positive);

        // Newton's method is affine invariant: scaling f by 1000 scales a by 1/1000 and leaves b.
        // A naive log(1 + exp(a f + b)) overflows from |a f + b| > 709 on, as at a = -1 below and
        // in the probabilities of +-1e6.
        assertThat(fitLarge.a() * 1000.0).isCloseTo(fitSmall.a(), within(1e-6 * Math.abs(fitSmall.a())));
        assertThat(fitLarge.b()).isCloseTo(fitSmall.b(), within(1e-6));
        double[] t = PlattScaling.targets(positive);
        assertThat(PlattScaling.loss(large, t, fitLarge.a(), fitLarge.b())).isFinite();
        assertThat(PlattScaling.loss(large, t, -1.0, 0.0)).isFinite().isGreaterThan(1000.0);
        for (double value : new double[] {-1e6, -3000.0, -1000.0, 0.0, 1000.0, 3000.0, 1e6}) {
            assertThat(fitLarge.probability(value)).isBetween(0.0, 1.0);
        }
        assertThat(fitLarge.probability(1e6)).isEqualTo(1.0);
        assertThat(fitLarge.probability(-1e6)).isEqualTo(0.0);
    }

    @Test
    void outliers_a_thousand_out_fit_where_the_naive_loss_overflows() {
        SplittableRandom random = new SplittableRandom(5L);
        int n = 300;
        double[] f = new double[n];
        boolean[] positive = new boolean[n];
        for (int i = 0; i < n; i++) {
            positive[i] = random.nextBoolean();
            f[i] = (positive[i] ? 0.5 : -0.5) + random.nextGaussian();
        }
        // Confident and right, so they hardly move the fit, but a f + b is in the thousands there.
        f[0] = 1000.0;
        positive[0] = true;
        f[1] = -3000.0;
        positive[1] = false;

        PlattScaling fit = PlattScaling.fit(f, positive);

        double[] t = PlattScaling.targets(positive);
        assertThat(fit.a()).isBetween(-10.0, -0.5);
        double da = (PlattScaling.loss(f, t, fit.a() + STEP, fit.b()) - PlattScaling.loss(f, t, fit.a() - STEP, fit.b()))
                / (2 * STEP);
        assertThat(da).isCloseTo(0.0, within(GRADIENT));
        // The textbook form −t log p − (1 − t) log(1 − p) with p = 1 / (1 + exp(a f + b)) breaks
        // at these outliers; the fit's form does not.
        double naive = 0.0;
        for (int i = 0; i < n; i++) {
            double p = 1.0 / (1.0 + Math.exp(fit.a() * f[i] + fit.b()));
            naive += -t[i] * Math.log(p) - (1.0 - t[i]) * Math.log(1.0 - p);
        }
        assertThat(naive).isInfinite();
        assertThat(PlattScaling.loss(f, t, fit.a(), fit.b())).isFinite();
    }

    @Test
    void refuses_inputs_it_cannot_fit() {
        assertThatThrownBy(() -> PlattScaling.fit(new double[0], new boolean[0]))
                .hasMessage("decisionValues must hold at least one value, was empty");
        assertThatThrownBy(() -> PlattScaling.fit(new double[2], new boolean[3]))
                .hasMessage("decisionValues and positive must have the same length, had 2 and 3");
        assertThatThrownBy(() -> PlattScaling.fit(new double[] {Double.NaN}, new boolean[1]))
                .hasMessage("decisionValues[0] must be finite, was NaN");
    }

    private static double goldenSection(DoubleUnaryOperator g, double low, double high) {
        double ratio = (Math.sqrt(5.0) - 1.0) / 2.0;
        double a = low;
        double b = high;
        double c = b - ratio * (b - a);
        double d = a + ratio * (b - a);
        while (b - a > SEARCH) {
            if (g.applyAsDouble(c) < g.applyAsDouble(d)) {
                b = d;
            } else {
                a = c;
            }
            c = b - ratio * (b - a);
            d = a + ratio * (b - a);
        }
        return 0.5 * (a + b);
    }
}
