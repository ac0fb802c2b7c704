package dev.pressmark.core.classify;

import static org.assertj.core.api.Assertions.assertThat;

import java.util.Arrays;
import java.util.SplittableRandom;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.constraints.DoubleRange;
import net.jqwik.api.constraints.IntRange;

/**
 * Warm starts along increasing C (Chu, Ho, Tsai, Lin and Lin, "Warm Start for Parameter Selection
 * of Linear Classifiers", KDD 2015) reach the optimum a cold start reaches. The yardstick is the
 * duality-gap certificate of {@link SolverPropertiesTest} (Hsieh et al., ICML 2008, section 2;
 * Yu, Huang and Lin 2011, eq. 4): a run that meets tolerance {@code t} lies within
 * {@code 2 t Σ C_i} (SVM) or {@code t Σ C_i} (logistic) of the optimal value, so a warm and a cold
 * run at the same C differ by at most that bound.
 */
class WarmStartPropertiesTest {

    /** The solver tolerance of these runs: tight enough for the certificate to mean something. */
    private static final double TOLERANCE = 1e-4;
    private static final int PLENTY = 1_000_000;
    /** Relative slack for rounding in the objectives. */
    private static final double ROUNDING = 1e-9;

    @Property(tries = 100)
    void a_warm_started_svm_reaches_the_cold_start_objective_at_every_c(@ForAll long seed,
            @ForAll @DoubleRange(min = 0.01, max = 2.0) double firstC, @ForAll @IntRange(min = 2, max = 5) int steps,
            @ForAll @DoubleRange(min = 1.2, max = 5.0) double factor,
            @ForAll @DoubleRange(min = 0.2, max = 5.0) double scaleError) {
        // any positive start scale, not only the ratio of the Cs, must reach the optimum (clipped into the box)
        RandomProblem problem = RandomProblem.draw(seed, 3);
        for (SvmLoss loss : SvmLoss.values()) {
            SvmConfig config = SvmConfig.defaults().withLoss(loss).withTolerance(TOLERANCE).withMaxIterations(PLENTY);
            double[] alpha = new double[problem.x().rows()];
            double c = firstC;
            for (int step = 0; step < steps; step++, c *= factor) {
                double[] cost = problem.costs(c);
                double[] warm = new double[problem.x().columns() + 1];
                SolverRun warmRun = SvmSolver.solve(problem.x(), problem.positive(), cost, config, new SplittableRandom(seed),
                        warm, alpha, step > 0 ? factor * scaleError : 0.0);
                double[] cold = new double[problem.x().columns() + 1];
                SolverRun coldRun = SvmSolver.solve(problem.x(), problem.positive(), cost, config, new SplittableRandom(seed),
                        cold, new double[problem.x().rows()]);
                assertThat(warmRun.converged() && coldRun.converged()).isTrue();
                double warmValue = SvmSolver.primalObjective(problem.x(), problem.positive(), cost, 1.0, loss, warm);
                double coldValue = SvmSolver.primalObjective(problem.x(), problem.positive(), cost, 1.0, loss, cold);
                double bound = 2.0 * TOLERANCE * Arrays.stream(cost).sum() + ROUNDING * (1.0 + coldValue);
                assertThat(Math.abs(warmValue - coldValue)).as("%s at c = %s", loss, c).isLessThanOrEqualTo(bound);
            }
        }
    }

    @Property(tries = 100)
    void a_warm_started_logistic_regression_reaches_the_cold_start_objective_at_every_c(@ForAll long seed,
            @ForAll @DoubleRange(min = 0.01, max = 2.0) double firstC, @ForAll @IntRange(min = 2, max = 5) int steps,
            @ForAll @DoubleRange(min = 1.2, max = 5.0) double factor,
            @ForAll @DoubleRange(min = 0.2, max = 5.0) double scaleError) {
        RandomProblem problem = RandomProblem.draw(seed, 3);
        LogisticConfig config = LogisticConfig.defaults().withTolerance(TOLERANCE).withMaxIterations(PLENTY);
        double[] alpha = new double[problem.x().rows()];
        double c = firstC;
        for (int step = 0; step < steps; step++, c *= factor) {
            double[] cost = problem.costs(c);
            double[] warm = new double[problem.x().columns() + 1];
            LogisticSolver.solve(problem.x(), problem.positive(), cost, config, new SplittableRandom(seed), warm, alpha,
                    step > 0 ? factor * scaleError : 0.0);
            for (int i = 0; i < alpha.length; i++) {
                assertThat(alpha[i]).isGreaterThan(0.0).isLessThan(cost[i]);
            }
            double[] cold = new double[problem.x().columns() + 1];
            LogisticSolver.solve(problem.x(), problem.positive(), cost, config, new SplittableRandom(seed), cold,
                    new double[problem.x().rows()]);
            double warmValue = LogisticSolver.primalObjective(problem.x(), problem.positive(), cost, 1.0, warm);
            double coldValue = LogisticSolver.primalObjective(problem.x(), problem.positive(), cost, 1.0, cold);
            double bound = TOLERANCE * Arrays.stream(cost).sum() + ROUNDING * (1.0 + coldValue);
            assertThat(Math.abs(warmValue - coldValue)).as("c = %s", c).isLessThanOrEqualTo(bound);
        }
    }

    @Property(tries = 30)
    void the_trainers_warm_start_every_one_versus_rest_problem(@ForAll long seed) {
        RandomProblem problem = RandomProblem.draw(seed, 3);
        int[] labels = problem.threeClasses(seed);
        WarmStart svmPath = new WarmStart();
        WarmStart logisticPath = new WarmStart();
        for (double c : new double[] {0.1, 0.5, 2.0}) {
            SvmConfig svm = SvmConfig.defaults().withC(c).withTolerance(TOLERANCE).withMaxIterations(PLENTY);
            SvmModel warm = new SvmTrainer(svm).train(problem.x(), labels, 3, seed, svmPath);
            SvmModel cold = new SvmTrainer(svm).train(problem.x(), labels, 3, seed);
            LogisticConfig logistic = LogisticConfig.defaults().withC(c).withTolerance(TOLERANCE).withMaxIterations(PLENTY);
            LogisticModel warmLogistic = new LogisticTrainer(logistic).train(problem.x(), labels, 3, seed, logisticPath);
            LogisticModel coldLogistic = new LogisticTrainer(logistic).train(problem.x(), labels, 3, seed);
            for (int k = 0; k < 3; k++) {
                boolean[] positive = Objectives.positives(labels, k);
                double[] cost = problem.costs(c);
                double sum = Arrays.stream(cost).sum();
                double coldValue = SvmSolver.primalObjective(problem.x(), positive, cost, 1.0, svm.loss(), cold.weights().vector(k));
                assertThat(Math.abs(SvmSolver.primalObjective(problem.x(), positive, cost, 1.0, svm.loss(), warm.weights().vector(k))
                        - coldValue)).isLessThanOrEqualTo(2.0 * TOLERANCE * sum + ROUNDING * (1.0 + coldValue));
                double coldLogisticValue = LogisticSolver.primalObjective(problem.x(), positive, cost, 1.0,
                        coldLogistic.weights().vector(k));
                assertThat(Math.abs(LogisticSolver.primalObjective(problem.x(), positive, cost, 1.0,
                        warmLogistic.weights().vector(k)) - coldLogisticValue))
                        .isLessThanOrEqualTo(TOLERANCE * sum + ROUNDING * (1.0 + coldLogisticValue));
            }
        }
    }
}
