package dev.pressmark.core.bench;

import dev.pressmark.core.classify.SvmConfig;
import dev.pressmark.core.classify.SvmLoss;
import dev.pressmark.core.classify.SvmModel;
import dev.pressmark.core.classify.SvmSolver;
import dev.pressmark.core.classify.SvmTrainer;
import dev.pressmark.core.feature.SparseMatrix;
import java.nio.file.Path;
import java.util.Arrays;
import java.util.Locale;
import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Fork;
import org.openjdk.jmh.annotations.Level;
import org.openjdk.jmh.annotations.Measurement;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Param;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.Warmup;

/**
 * pressmark's squared-hinge SVM solver on a matrix written in the svmlight format by another
 * program, for a comparison with the C LIBLINEAR on the very same rows: scripts/bench-solver.sh
 * writes the file and solves it with scikit-learn's LinearSVC, then runs this benchmark.
 *
 * <p>Same problem as the reference: no bias feature (LinearSVC with {@code fit_intercept=False}),
 * the same C, loss, tolerance and iteration cap, so both minimise
 * {@code ½‖w‖² + C Σ max(0, 1 − y_i wᵀx_i)²}. The setup solves once and prints, on lines starting
 * {@value #PREFIX}, our objective and passes, and (when {@code referenceWeights} names the
 * reference's weight file) the same objective function evaluated at the reference's weights, both
 * by {@link SvmSolver#primalObjective}. The benchmark times one whole training: the per-row arrays,
 * the passes and the model.
 *
 * <pre>mvn -q -B -pl model-core -Pbench test-compile exec:exec \
 *   -Djmh.args="SvmLightSolveBenchmark -p file=/tmp/problem.svm -p c=1 -p tolerance=0.1"</pre>
 */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.SingleShotTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
@Fork(value = 1, jvmArgsAppend = {"-Xms4g", "-Xmx4g"})
@Warmup(iterations = 3)
@Measurement(iterations = 7)
public class SvmLightSolveBenchmark {

    static final String PREFIX = "solver-bench:";
    static final long SEED = 7L;
    /** LinearSVC's default {@code max_iter}. */
    static final int MAX_ITERATIONS = 1000;

    /** The svmlight file. */
    @Param("")
    public String file;

    @Param("1")
    public double c;

    @Param("0.1")
    public double tolerance;

    /** The reference's weights, one per line (numpy.savetxt), or empty. */
    @Param("")
    public String referenceWeights;

    private SparseMatrix x;
    private int[] labels;
    private SvmConfig config;

    @Setup(Level.Trial)
    public void setUp() {
        if (file.isEmpty()) {
            throw new IllegalArgumentException("give the svmlight file with -p file=PATH");
        }
        double[] reference = referenceWeights.isEmpty() ? null : SvmLightFile.readVector(Path.of(referenceWeights));
        SvmLightFile.Problem problem = SvmLightFile.read(Path.of(file), reference == null ? 0 : reference.length);
        x = problem.x();
        labels = problem.binaryLabels();
        config = new SvmConfig(c, SvmLoss.SQUARED_HINGE, tolerance, MAX_ITERATIONS, 0.0);
        SvmModel model = new SvmTrainer(config).train(x, labels, 2, SEED);
        double[] w = Arrays.copyOf(model.weights().featureWeights(0), x.columns() + 1);
        System.out.printf(Locale.ROOT, "%n%s matrix %d %d %d%n", PREFIX, x.rows(), x.columns(), x.nonZeros());
        System.out.printf(Locale.ROOT, "%s ours objective %.10f passes %d converged %b%n", PREFIX, objective(w),
                model.convergence().maxIterations(), model.converged());
        if (reference != null) {
            System.out.printf(Locale.ROOT, "%s reference-weights objective %.10f%n", PREFIX,
                    objective(Arrays.copyOf(reference, x.columns() + 1)));
        }
    }

    /** The primal objective at {@code w} (features, then a bias weight that multiplies nothing). */
    private double objective(double[] w) {
        boolean[] positive = new boolean[labels.length];
        double[] cost = new double[labels.length];
        for (int i = 0; i < labels.length; i++) {
            positive[i] = labels[i] == 1;
            cost[i] = c;
        }
        return SvmSolver.primalObjective(x, positive, cost, 0.0, SvmLoss.SQUARED_HINGE, w);
    }

    @Benchmark
    public SvmModel solve() {
        return new SvmTrainer(config).train(x, labels, 2, SEED);
    }
}
