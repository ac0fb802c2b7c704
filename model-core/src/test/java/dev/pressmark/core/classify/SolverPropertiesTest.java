package dev.pressmark.core.classify;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Map;
import java.util.SplittableRandom;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.constraints.DoubleRange;
import net.jqwik.api.constraints.IntRange;

/** Invariants of the dual solvers on small random sparse problems. */
class SolverPropertiesTest {

    /** {@code w} is updated incrementally; recomputing Σ y α x in another order differs by rounding. */
    private static final double ROUNDING = 1e-9;
    /** A solver tolerance at which the duality gap is far below {@link #GAP}. */
    private static final double TIGHT = 1e-7;
    /** Relative slack for the remaining duality gap and rounding. */
    private static final double GAP = 1e-9;
    /**
     * Passes enough for a tight tolerance on every problem drawn here. Ill-conditioned ones need
     * more than the default cap of 1,000: about 2,300 for the squared hinge at c near 10, and up to
     * about 114,000 for the hinge on a degenerate one (half its rows empty, so many duals share one
     * row and drift along a flat valley). A pass over 40 rows takes microseconds.
     */
    private static final int PLENTY = 1_000_000;

    @Property(tries = 100)
    void hinge_duals_stay_in_their_box_and_define_the_weights(@ForAll long seed,
            @ForAll @DoubleRange(min = 0.01, max = 10.0) double c) {
        RandomProblem problem = RandomProblem.draw(seed, 2);
        double[] cost = problem.costs(c);
        double[] w = new double[problem.x().columns() + 1];
        double[] alpha = new double[problem.x().rows()];

        SvmSolver.solve(problem.x(), problem.positive(), cost, SvmConfig.defaults().withLoss(SvmLoss.HINGE),
                new SplittableRandom(seed), w, alpha);

        for (int i = 0; i < alpha.length; i++) {
            assertThat(alpha[i]).isBetween(0.0, cost[i]);
        }
        assertWeightsAreTheDualCombination(problem, alpha, w, 1.0);
    }

    @Property(tries = 100)
    void squared_hinge_duals_stay_non_negative_and_define_the_weights(@ForAll long seed,
            @ForAll @DoubleRange(min = 0.01, max = 10.0) double c) {
        RandomProblem problem = RandomProblem.draw(seed, 2);
        double[] w = new double[problem.x().columns() + 1];
        double[] alpha = new double[problem.x().rows()];

        SvmSolver.solve(problem.x(), problem.positive(), problem.costs(c), SvmConfig.defaults(), new SplittableRandom(seed),
                w, alpha);

        for (double a : alpha) {
            assertThat(a).isGreaterThanOrEqualTo(0.0);
        }
        assertWeightsAreTheDualCombination(problem, alpha, w, 1.0);
    }

    @Property(tries = 100)
    void logistic_duals_stay_strictly_inside_their_box_and_define_the_weights(@ForAll long seed,
            @ForAll @DoubleRange(min = 0.01, max = 10.0) double c) {
        RandomProblem problem = RandomProblem.draw(seed, 2);
        double[] cost = problem.costs(c);
        double[] w = new double[problem.x().columns() + 1];
        double[] alpha = new double[problem.x().rows()];

        LogisticSolver.solve(problem.x(), problem.positive(), cost, LogisticConfig.defaults(), new SplittableRandom(seed),
                w, alpha);

        for (int i = 0; i < alpha.length; i++) {
            assertThat(alpha[i]).isGreaterThan(0.0).isLessThan(cost[i]);
        }
        assertWeightsAreTheDualCombination(problem, alpha, w, 1.0);
    }

    /**
     * A dual method promises nothing about the primal value of an early iterate (at the default
     * tolerance a tiny problem whose optimum is w = 0 can end a hair above P(0), and an iterate cut
     * off by the iteration cap can be far above it); converged at a tight tolerance, the duality
     * gap is negligible and the returned w must be no worse than 0.
     */
    @Property(tries = 100)
    void the_trained_weights_are_no_worse_than_the_zero_vector(@ForAll long seed,
            @ForAll @DoubleRange(min = 0.01, max = 10.0) double c) {
        RandomProblem problem = RandomProblem.draw(seed, 2);
        double[] cost = problem.costs(c);
        double[] zero = new double[problem.x().columns() + 1];
        for (SvmLoss loss : SvmLoss.values()) {
            double[] w = Solved.svm(problem, cost, loss, seed).w;
            double atZero = SvmSolver.primalObjective(problem.x(), problem.positive(), cost, 1.0, loss, zero);
            assertThat(SvmSolver.primalObjective(problem.x(), problem.positive(), cost, 1.0, loss, w))
                    .isLessThanOrEqualTo(atZero * (1.0 + GAP));
        }
        double[] w = Solved.logistic(problem, cost, seed).w;
        double atZero = LogisticSolver.primalObjective(problem.x(), problem.positive(), cost, 1.0, zero);
        assertThat(LogisticSolver.primalObjective(problem.x(), problem.positive(), cost, 1.0, w))
                .isLessThanOrEqualTo(atZero * (1.0 + GAP));
    }

    /**
     * Weak duality: P(w) + f(α) &gt;= 0 for any dual-feasible α, with equality only at the optimum
     * (Hsieh et al., ICML 2008, section 2). Per row, the KKT slack that the stopping rule bounds by
     * the tolerance bounds this row's share of the gap by 2 · tolerance · C_i under the hinge and by
     * less under the squared hinge, so a converged run's gap is at most 2 · tolerance · Σ C_i. The
     * bound comes from w and α as returned, whatever route the solver took to them.
     */
    @Property(tries = 100)
    void a_converged_run_closes_the_duality_gap(@ForAll long seed,
            @ForAll @DoubleRange(min = 0.01, max = 10.0) double c) {
        RandomProblem problem = RandomProblem.draw(seed, 2);
        double[] cost = problem.costs(c);
        for (SvmLoss loss : SvmLoss.values()) {
            Solved solved = Solved.svm(problem, cost, loss, seed);
            double primal = SvmSolver.primalObjective(problem.x(), problem.positive(), cost, 1.0, loss, solved.w);
            double gap = primal + dualObjective(loss, cost, solved.alpha, solved.w);
            double bound = 2.0 * TIGHT * Arrays.stream(cost).sum() + ROUNDING * (1.0 + primal);
            assertThat(gap).as("%s duality gap", loss).isBetween(-ROUNDING * (1.0 + primal), bound);
        }
    }

    /**
     * The same certificate for logistic regression. Its dual (Yu, Huang and Lin, 2011, eq. 4, with
     * the constant −Σ C_i log C_i that makes the optimal values meet) is f(α) = ½‖w‖² +
     * Σ_i [α_i log α_i + (C_i − α_i) log(C_i − α_i) − C_i log C_i]. Row i's share of P(w) + f(α)
     * is C_i times the Kullback-Leibler divergence between two Bernoulli laws whose log-odds differ
     * by the dual gradient that the stopping rule bounds, at most C_i · tolerance² / 8. The bound
     * allowed here, tolerance · Σ C_i, leaves room for the gradients of the last pass being read
     * before each row's own step.
     */
    @Property(tries = 100)
    void a_converged_logistic_run_closes_the_duality_gap(@ForAll long seed,
            @ForAll @DoubleRange(min = 0.01, max = 10.0) double c) {
        RandomProblem problem = RandomProblem.draw(seed, 2);
        double[] cost = problem.costs(c);
        Solved solved = Solved.logistic(problem, cost, seed);
        double[] alpha = solved.alpha;
        double primal = LogisticSolver.primalObjective(problem.x(), problem.positive(), cost, 1.0, solved.w);
        double dual = 0.5 * Rows.squaredNorm(solved.w);
        for (int i = 0; i < alpha.length; i++) {
            double rest = cost[i] - alpha[i];
            dual += alpha[i] * Math.log(alpha[i]) + rest * Math.log(rest) - cost[i] * Math.log(cost[i]);
        }
        double gap = primal + dual;
        assertThat(gap).isBetween(-ROUNDING * (1.0 + primal), TIGHT * Arrays.stream(cost).sum() + ROUNDING * (1.0 + primal));
    }

    @Property(tries = 50)
    void one_versus_rest_over_two_classes_agrees_with_the_binary_model(@ForAll long seed) {
        RandomProblem problem = RandomProblem.draw(seed, 2);
        int[] labels = problem.labels();
        double[] cost = problem.costs(1.0);
        SvmConfig config = SvmConfig.defaults().withTolerance(1e-6).withMaxIterations(PLENTY);
        SvmTrainer svm = new SvmTrainer(config);
        LogisticTrainer logistic = new LogisticTrainer(
                LogisticConfig.defaults().withTolerance(1e-6).withMaxIterations(PLENTY));
        List<SolverRun> runs = new ArrayList<>();

        double[] binarySvm = svm.solve(problem.x(), labels, new int[] {1}, cost, seed, runs)[0];
        double[][] bothSvm = svm.solve(problem.x(), labels, new int[] {0, 1}, cost, seed, runs);
        double[] binaryLogistic = logistic.solve(problem.x(), labels, new int[] {1}, cost, seed, runs)[0];
        double[][] bothLogistic = logistic.solve(problem.x(), labels, new int[] {0, 1}, cost, seed, runs);

        // "0 against 1" draws the binary problem's random stream and is its mirror image: the
        // dual updates are symmetric under y → −y, w → −w, and IEEE negation is exact.
        assertThat(bothSvm[0]).containsExactly(negate(binarySvm));
        assertThat(bothLogistic[0]).containsExactly(negate(binaryLogistic));
        // "1 against 0" is the binary problem itself, solved in another random order: the same
        // optimum, up to the tolerance.
        boolean[] positive = problem.positive();
        double svmOptimum = SvmSolver.primalObjective(problem.x(), positive, cost, 1.0, config.loss(), binarySvm);
        assertThat(SvmSolver.primalObjective(problem.x(), positive, cost, 1.0, config.loss(), bothSvm[1]))
                .isCloseTo(svmOptimum, within(1e-6 * svmOptimum));
        double logisticOptimum = LogisticSolver.primalObjective(problem.x(), positive, cost, 1.0, binaryLogistic);
        assertThat(LogisticSolver.primalObjective(problem.x(), positive, cost, 1.0, bothLogistic[1]))
                .isCloseTo(logisticOptimum, within(1e-6 * logisticOptimum));
    }

    @Property(tries = 50)
    void scaling_every_class_weight_by_a_power_of_two_equals_scaling_c(@ForAll long seed,
            @ForAll @IntRange(min = -4, max = 4) int exponent, @ForAll @DoubleRange(min = 0.1, max = 4.0) double w0,
            @ForAll @DoubleRange(min = 0.1, max = 4.0) double w1) {
        RandomProblem problem = RandomProblem.draw(seed, 2);
        double k = Math.scalb(1.0, exponent);
        int[] labels = problem.labels();

        // A power of two makes c · (k · w) and (k · c) · w the same double, so both solves take
        // identical steps and must return identical weights.
        SvmModel weighted = new SvmTrainer(SvmConfig.defaults(), ClassWeights.of(Map.of(0, k * w0, 1, k * w1)))
                .train(problem.x(), labels, 2, seed);
        SvmModel scaledC = new SvmTrainer(SvmConfig.defaults().withC(k), ClassWeights.of(Map.of(0, w0, 1, w1)))
                .train(problem.x(), labels, 2, seed);
        LogisticModel weightedLogistic = new LogisticTrainer(LogisticConfig.defaults(),
                ClassWeights.of(Map.of(0, k * w0, 1, k * w1))).train(problem.x(), labels, 2, seed);
        LogisticModel scaledCLogistic = new LogisticTrainer(LogisticConfig.defaults().withC(k),
                ClassWeights.of(Map.of(0, w0, 1, w1))).train(problem.x(), labels, 2, seed);

        assertThat(weighted.weights().vector(0)).containsExactly(scaledC.weights().vector(0));
        assertThat(weightedLogistic.weights().vector(0)).containsExactly(scaledCLogistic.weights().vector(0));
    }

    @Property(tries = 30)
    void scaling_every_class_weight_by_any_factor_reaches_the_optimum_of_scaling_c(@ForAll long seed,
            @ForAll @DoubleRange(min = 0.2, max = 5.0) double k) {
        RandomProblem problem = RandomProblem.draw(seed, 2);
        int[] labels = problem.labels();
        SvmConfig config = SvmConfig.defaults().withTolerance(1e-8).withMaxIterations(PLENTY);

        SvmModel weighted = new SvmTrainer(config, ClassWeights.of(Map.of(0, k, 1, k))).train(problem.x(), labels, 2, seed);
        SvmModel scaledC = new SvmTrainer(config.withC(k)).train(problem.x(), labels, 2, seed);

        // Same objective up to the last bits of each cost, so the same optimum within the tolerance.
        double[] cost = problem.costs(k);
        double a = SvmSolver.primalObjective(problem.x(), problem.positive(), cost, 1.0, config.loss(), weighted.weights().vector(0));
        double b = SvmSolver.primalObjective(problem.x(), problem.positive(), cost, 1.0, config.loss(), scaledC.weights().vector(0));
        assertThat(a).isCloseTo(b, within(1e-8 * b));
    }

    private static void assertWeightsAreTheDualCombination(RandomProblem problem, double[] alpha, double[] w, double bias) {
        double[] expected = new double[w.length];
        for (int i = 0; i < alpha.length; i++) {
            double scale = problem.positive()[i] ? alpha[i] : -alpha[i];
            problem.x().addScaledRow(i, scale, expected);
            expected[problem.x().columns()] += scale * bias;
        }
        for (int j = 0; j < w.length; j++) {
            assertThat(w[j]).isCloseTo(expected[j], within(ROUNDING * (1.0 + Math.abs(expected[j]))));
        }
    }

    /** The dual {@code f(α) = ½‖w‖² + Σ_i D_ii α_i² / 2 − Σ_i α_i} with {@code w = Σ_i y_i α_i x_i}. */
    private static double dualObjective(SvmLoss loss, double[] cost, double[] alpha, double[] w) {
        double sum = 0.5 * Rows.squaredNorm(w);
        for (int i = 0; i < alpha.length; i++) {
            double diagonal = loss == SvmLoss.HINGE ? 0.0 : 0.5 / cost[i];
            sum += 0.5 * diagonal * alpha[i] * alpha[i] - alpha[i];
        }
        return sum;
    }

    private static double[] negate(double[] w) {
        double[] out = new double[w.length];
        for (int j = 0; j < w.length; j++) {
            out[j] = 0.0 - w[j]; // keeps an untouched +0.0 from becoming -0.0
        }
        return out;
    }

    /** The weights and duals of a solve at {@link #TIGHT} within {@link #PLENTY} passes, which must converge. */
    private record Solved(double[] w, double[] alpha) {

        static Solved svm(RandomProblem problem, double[] cost, SvmLoss loss, long seed) {
            Solved solved = empty(problem);
            SolverRun run = SvmSolver.solve(problem.x(), problem.positive(), cost,
                    SvmConfig.defaults().withLoss(loss).withTolerance(TIGHT).withMaxIterations(PLENTY),
                    new SplittableRandom(seed), solved.w, solved.alpha);
            assertThat(run.converged()).as("%s converged", loss).isTrue();
            return solved;
        }

        static Solved logistic(RandomProblem problem, double[] cost, long seed) {
            Solved solved = empty(problem);
            SolverRun run = LogisticSolver.solve(problem.x(), problem.positive(), cost,
                    LogisticConfig.defaults().withTolerance(TIGHT).withMaxIterations(PLENTY),
                    new SplittableRandom(seed), solved.w, solved.alpha);
            assertThat(run.converged()).as("logistic converged").isTrue();
            return solved;
        }

        private static Solved empty(RandomProblem problem) {
            return new Solved(new double[problem.x().columns() + 1], new double[problem.x().rows()]);
        }
    }
}
