package dev.pressmark.core.classify;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import dev.pressmark.core.feature.SparseMatrix;
import java.util.Arrays;
import java.util.SplittableRandom;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.constraints.IntRange;

/**
 * Case weights against the identity that defines them: a row of integer weight {@code w} costs
 * exactly what {@code w} copies of it cost, so training with weights and training on the rows
 * repeated minimise the same primal and reach the same optimum. The weighted primal
 * {@code ½‖w‖² + Σ_i C·W_i·ξ_i} is the one of the instance-weight extension of LIBLINEAR
 * (C.-J. Lin's "LIBSVM Tools" page, "weights for data instances"), where {@code C_i = C × W_i}.
 */
class CaseWeightPropertiesTest {

    /** A solver tolerance at which the duality gap is negligible next to {@link #OBJECTIVE}. */
    private static final double TIGHT = 1e-8;
    /** Passes enough to meet {@link #TIGHT} on these small problems. */
    private static final int PLENTY = 1_000_000;
    /** Relative slack between two optima reached at {@link #TIGHT} in different visiting orders. */
    private static final double OBJECTIVE = 1e-7;
    /**
     * Slack on a decision value: with the strongly convex ½‖w‖², an objective gap ε moves w by at
     * most sqrt(2ε); rows have unit norm, so decision values move by about as much.
     */
    private static final double DECISION = 1e-3;
    /** Class weights other than 1, so that the products with case weights are exercised too. */
    private static final ClassWeights CLASS_WEIGHTS = ClassWeights.of(java.util.Map.of(0, 2.0, 1, 0.5));

    @Property(tries = 40)
    void an_svm_row_of_integer_weight_w_trains_as_w_copies_of_it(@ForAll long seed,
            @ForAll @IntRange(min = 2, max = 3) int classes) {
        Weighted problem = Weighted.draw(seed, classes);
        for (SvmLoss loss : SvmLoss.values()) {
            SvmConfig config = SvmConfig.defaults().withLoss(loss).withTolerance(TIGHT).withMaxIterations(PLENTY);
            SvmTrainer trainer = new SvmTrainer(config, CLASS_WEIGHTS);
            SvmModel weighted = trainer.train(problem.x, problem.labels, problem.weights, classes, seed, null);
            SvmModel repeated = trainer.train(problem.repeatedX(), problem.repeatedLabels(), classes, seed);
            assertThat(weighted.convergence().converged()).isTrue();
            assertThat(repeated.convergence().converged()).isTrue();

            double[] cost = OneVsRest.costs(problem.labels, config.c(),
                    CLASS_WEIGHTS.resolve(problem.labels, classes), problem.weights);
            for (int k = 0; k < weighted.weights().numScores(); k++) {
                boolean[] positive = problem.positive(classes, k);
                double a = SvmSolver.primalObjective(problem.x, positive, cost, config.bias(), loss, weighted.weights().vector(k));
                double b = SvmSolver.primalObjective(problem.x, positive, cost, config.bias(), loss, repeated.weights().vector(k));
                assertThat(a).isCloseTo(b, within(OBJECTIVE * b));
            }
            assertSamePredictions(weighted, repeated, problem.test);
        }
    }

    @Property(tries = 40)
    void a_logistic_row_of_integer_weight_w_trains_as_w_copies_of_it(@ForAll long seed,
            @ForAll @IntRange(min = 2, max = 3) int classes) {
        Weighted problem = Weighted.draw(seed, classes);
        LogisticConfig config = LogisticConfig.defaults().withTolerance(TIGHT).withMaxIterations(PLENTY);
        LogisticTrainer trainer = new LogisticTrainer(config, CLASS_WEIGHTS);
        LogisticModel weighted = trainer.train(problem.x, problem.labels, problem.weights, classes, seed, null);
        LogisticModel repeated = trainer.train(problem.repeatedX(), problem.repeatedLabels(), classes, seed);
        assertThat(weighted.convergence().converged()).isTrue();
        assertThat(repeated.convergence().converged()).isTrue();

        double[] cost = OneVsRest.costs(problem.labels, config.c(),
                CLASS_WEIGHTS.resolve(problem.labels, classes), problem.weights);
        for (int k = 0; k < weighted.weights().numScores(); k++) {
            boolean[] positive = problem.positive(classes, k);
            double a = LogisticSolver.primalObjective(problem.x, positive, cost, config.bias(), weighted.weights().vector(k));
            double b = LogisticSolver.primalObjective(problem.x, positive, cost, config.bias(), repeated.weights().vector(k));
            assertThat(a).isCloseTo(b, within(OBJECTIVE * b));
        }
        assertSamePredictions(weighted, repeated, problem.test);
    }

    @Property(tries = 40)
    void a_row_of_weight_0_is_as_if_it_were_absent(@ForAll long seed) {
        Weighted problem = Weighted.draw(seed, 2);
        int[] kept = problem.rowsOfWeightAbove0();
        double[] ones = new double[problem.labels.length];
        for (int i = 0; i < ones.length; i++) {
            ones[i] = problem.weights[i] == 0.0 ? 0.0 : 1.0;
        }
        SparseMatrix xKept = problem.x.rowSubset(kept);
        int[] labelsKept = select(problem.labels, kept);

        for (SvmLoss loss : SvmLoss.values()) {
            SvmTrainer svm = new SvmTrainer(SvmConfig.defaults().withLoss(loss).withTolerance(TIGHT).withMaxIterations(PLENTY));
            assertCloseWeights(svm.train(problem.x, problem.labels, ones, 2, seed, null), svm.train(xKept, labelsKept, 2, seed));
        }
        LogisticTrainer logistic = new LogisticTrainer(LogisticConfig.defaults().withTolerance(TIGHT).withMaxIterations(PLENTY));
        assertCloseWeights(logistic.train(problem.x, problem.labels, ones, 2, seed, null),
                logistic.train(xKept, labelsKept, 2, seed));
    }

    @Property(tries = 20)
    void the_dual_variable_of_a_row_of_cost_0_stays_0(@ForAll long seed) {
        Weighted problem = Weighted.draw(seed, 2);
        double[] cost = new double[problem.labels.length];
        for (int i = 0; i < cost.length; i++) {
            cost[i] = problem.weights[i];
        }
        boolean[] positive = problem.positive(2, 0);
        for (SvmLoss loss : SvmLoss.values()) {
            double[] w = new double[problem.x.columns() + 1];
            double[] alpha = new double[cost.length];
            Arrays.fill(alpha, 0.5); // a warm start that puts weight on every row, clipped into the box
            SolverRun run = SvmSolver.solve(problem.x, positive, cost, SvmConfig.defaults().withLoss(loss), new SplittableRandom(seed),
                    w, alpha, 2.0);
            assertThat(run.converged()).isTrue();
            assertZeroWhereCostIs0(cost, alpha);
        }
        double[] w = new double[problem.x.columns() + 1];
        double[] alpha = new double[cost.length];
        SolverRun run = LogisticSolver.solve(problem.x, positive, cost, LogisticConfig.defaults(), new SplittableRandom(seed), w, alpha);
        assertThat(run.converged()).isTrue();
        assertZeroWhereCostIs0(cost, alpha);
    }

    @Property(tries = 5)
    void every_row_of_weight_0_gives_the_zero_model(@ForAll long seed) {
        Weighted problem = Weighted.draw(seed, 2);
        double[] zeros = new double[problem.labels.length];
        SvmModel svm = new SvmTrainer(SvmConfig.defaults()).train(problem.x, problem.labels, zeros, 2, seed, null);
        LogisticModel logistic = new LogisticTrainer(LogisticConfig.defaults()).train(problem.x, problem.labels, zeros, 2, seed, null);
        assertThat(svm.weights().vector(0)).containsOnly(0.0);
        assertThat(logistic.weights().vector(0)).containsOnly(0.0);
    }

    private static void assertZeroWhereCostIs0(double[] cost, double[] alpha) {
        int zeros = 0;
        for (int i = 0; i < cost.length; i++) {
            if (cost[i] == 0.0) {
                assertThat(alpha[i]).as("alpha[%d] of a row of cost 0", i).isEqualTo(0.0);
                zeros++;
            }
        }
        assertThat(zeros).isPositive();
    }

    private static void assertCloseWeights(LinearClassifier a, LinearClassifier b) {
        double[] va = a.weights().vector(0);
        double[] vb = b.weights().vector(0);
        for (int j = 0; j < va.length; j++) {
            assertThat(va[j]).isCloseTo(vb[j], within(DECISION));
        }
    }

    private static void assertSamePredictions(LinearClassifier weighted, LinearClassifier repeated, SparseMatrix test) {
        int[] p = weighted.predict(test);
        int[] q = repeated.predict(test);
        for (int i = 0; i < test.rows(); i++) {
            double[] a = weighted.decisionValues(test, i);
            double[] b = repeated.decisionValues(test, i);
            for (int k = 0; k < a.length; k++) {
                assertThat(a[k]).isCloseTo(b[k], within(DECISION));
            }
            if (DecisionMargins.clearWinner(a, DECISION)) {
                assertThat(p[i]).as("prediction for test row %d", i).isEqualTo(q[i]);
            }
        }
    }

    private static int[] select(int[] values, int[] rows) {
        int[] out = new int[rows.length];
        for (int i = 0; i < rows.length; i++) {
            out[i] = values[rows[i]];
        }
        return out;
    }

    /** A small bag-of-words problem with an integer weight 0..3 per row, every class keeping weight. */
    private record Weighted(SparseMatrix x, int[] labels, double[] weights, SparseMatrix test) {

        static Weighted draw(long seed, int classes) {
            SyntheticProblem.Split split = SyntheticProblem.generate(seed, 30, 20, 25, 4, classes, 0.1);
            SplittableRandom random = new SplittableRandom(seed ^ 0x5DEECE66DL);
            int[] labels = split.train().labels();
            double[] weights = new double[labels.length];
            for (int i = 0; i < weights.length; i++) {
                weights[i] = random.nextInt(4);
            }
            // every class keeps a row of weight >= 1, so the repeated set has all of them
            for (int k = 0; k < classes; k++) {
                for (int i = 0; i < labels.length; i++) {
                    if (labels[i] == k) {
                        weights[i] = Math.max(weights[i], 1.0);
                        break;
                    }
                }
            }
            return new Weighted(split.train().x(), labels, weights, split.test().x());
        }

        int[] repeatedRows() {
            int total = 0;
            for (double w : weights) {
                total += (int) w;
            }
            int[] rows = new int[total];
            int next = 0;
            for (int i = 0; i < weights.length; i++) {
                for (int r = 0; r < (int) weights[i]; r++) {
                    rows[next++] = i;
                }
            }
            return rows;
        }

        int[] rowsOfWeightAbove0() {
            int[] rows = new int[labels.length];
            int next = 0;
            for (int i = 0; i < labels.length; i++) {
                if (weights[i] > 0.0) {
                    rows[next++] = i;
                }
            }
            return Arrays.copyOf(rows, next);
        }

        SparseMatrix repeatedX() {
            return x.rowSubset(repeatedRows());
        }

        int[] repeatedLabels() {
            return select(labels, repeatedRows());
        }

        /** The sign vector of binary problem {@code k} of one versus rest. */
        boolean[] positive(int classes, int k) {
            int positiveClass = OneVsRest.positiveClasses(classes)[k];
            boolean[] out = new boolean[labels.length];
            for (int i = 0; i < out.length; i++) {
                out[i] = labels[i] == positiveClass;
            }
            return out;
        }
    }
}
