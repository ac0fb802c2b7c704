package dev.pressmark.core.classify;

import static org.assertj.core.api.Assertions.assertThat;

import java.util.Arrays;
import java.util.SplittableRandom;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.constraints.IntRange;
import org.apache.commons.math3.analysis.MultivariateFunction;
import org.apache.commons.math3.optim.InitialGuess;
import org.apache.commons.math3.optim.MaxEval;
import org.apache.commons.math3.optim.PointValuePair;
import org.apache.commons.math3.optim.nonlinear.scalar.GoalType;
import org.apache.commons.math3.optim.nonlinear.scalar.ObjectiveFunction;
import org.apache.commons.math3.optim.nonlinear.scalar.noderiv.NelderMeadSimplex;
import org.apache.commons.math3.optim.nonlinear.scalar.noderiv.SimplexOptimizer;

/**
 * Platt scaling's Newton fit against a general-purpose minimiser, commons-math3's Nelder-Mead
 * simplex (org.apache.commons:commons-math3, test scope), on random decision values: separable and
 * overlapping sets, one class only, ties, and scales from 0.01 to 100.
 */
class PlattScalingPropertiesTest {

    /**
     * Relative slack: the simplex stops at a relative change of 1e-12 and our fit at a gradient of
     * 1e-5, so either can sit a little above the shared minimum of a flat loss.
     */
    private static final double SLACK = 1e-7;

    @Property(tries = 200)
    void the_fit_is_no_worse_than_a_general_purpose_minimiser(@ForAll long seed,
            @ForAll @IntRange(min = 1, max = 60) int n, @ForAll @IntRange(min = -2, max = 2) int scaleExponent) {
        SplittableRandom random = new SplittableRandom(seed);
        double scale = Math.pow(10.0, scaleExponent);
        double shift = random.nextDouble(-3.0, 3.0);
        double[] f = new double[n];
        boolean[] positive = new boolean[n];
        for (int i = 0; i < n; i++) {
            positive[i] = random.nextBoolean();
            // rounding to a grid makes ties; the shift between classes runs from separable to mixed
            double value = (positive[i] ? shift : 0.0) + random.nextGaussian();
            f[i] = scale * Math.rint(value * 4.0) / 4.0;
        }
        double[] t = PlattScaling.targets(positive);

        PlattScaling fit = PlattScaling.fit(f, positive);
        double ours = naiveLoss(f, t, fit.a(), fit.b());

        MultivariateFunction loss = p -> naiveLoss(f, t, p[0], p[1]);
        SimplexOptimizer simplex = new SimplexOptimizer(1e-12, 1e-14);
        PointValuePair best = null;
        // restarting from the simplex's own answer keeps it from stalling on a long valley
        double[] start = {0.0, 0.0};
        for (int restart = 0; restart < 3; restart++) {
            PointValuePair found = simplex.optimize(new MaxEval(20_000), new ObjectiveFunction(loss), GoalType.MINIMIZE,
                    new InitialGuess(start), new NelderMeadSimplex(new double[] {1.0 / scale, 1.0}));
            if (best == null || found.getValue() < best.getValue()) {
                best = found;
            }
            start = found.getPoint();
        }

        assertThat(ours).as("ours at a = %s, b = %s; the simplex's at %s", fit.a(), fit.b(),
                Arrays.toString(best.getPoint())).isLessThanOrEqualTo(best.getValue() * (1.0 + SLACK) + SLACK);
    }

    /**
     * The cross-entropy written as plainly as the paper states it; with |a·f + b| below about 700
     * (which holds at every point either minimiser visits here) nothing overflows.
     */
    private static double naiveLoss(double[] f, double[] t, double a, double b) {
        double sum = 0.0;
        for (int i = 0; i < f.length; i++) {
            double p = 1.0 / (1.0 + Math.exp(a * f[i] + b));
            sum -= t[i] * Math.log(p) + (1.0 - t[i]) * Math.log1p(-p);
        }
        return sum;
    }
}
