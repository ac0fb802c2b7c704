package dev.pressmark.core.classify;

import de.bwaldvogel.liblinear.Linear;
import de.bwaldvogel.liblinear.Model;
import de.bwaldvogel.liblinear.Parameter;
import de.bwaldvogel.liblinear.Problem;
import de.bwaldvogel.liblinear.SolverType;
import dev.pressmark.core.feature.SparseMatrix;
import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Fork;
import org.openjdk.jmh.annotations.Measurement;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Param;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.Warmup;

/**
 * One binary solve, ours against LIBLINEAR's Java port (de.bwaldvogel:liblinear 2.44), on the
 * synthetic problem of {@link LiblinearSyntheticTest}: 2,000 rows, 5,000 columns, 20 non-zeros a
 * row, c 1, bias 1. The reference's input is built once, outside the measurement.
 *
 * <pre>mvn -q -B -pl model-core -Pbench test-compile exec:exec -Djmh.args="SolverBenchmark"</pre>
 */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
@Fork(1)
@Warmup(iterations = 3, time = 2)
@Measurement(iterations = 5, time = 2)
public class SolverBenchmark {

    /** SQUARED_HINGE, HINGE or LOGISTIC. */
    @Param({"SQUARED_HINGE", "HINGE", "LOGISTIC"})
    public String solver;

    @Param({"0.1", "0.001"})
    public double tolerance;

    private SparseMatrix x;
    private int[] labels;
    private Problem problem;

    @Setup
    public void setUp() {
        SyntheticProblem train = SyntheticProblem.generate(42L, 2000, 1, 5000, 20, 2, 0.05).train();
        x = train.x();
        labels = train.labels();
        Linear.disableDebugOutput();
        problem = new Problem();
        problem.l = x.rows();
        problem.n = x.columns() + 1;
        problem.bias = 1.0;
        problem.x = Liblinear.rows(x, 1.0);
        problem.y = new double[labels.length];
        for (int i = 0; i < labels.length; i++) {
            problem.y[i] = labels[i];
        }
    }

    @Benchmark
    public LinearClassifier ours() {
        if (solver.equals("LOGISTIC")) {
            return new LogisticTrainer(LogisticConfig.defaults().withTolerance(tolerance)).train(x, labels, 2, 7L);
        }
        SvmConfig config = SvmConfig.defaults().withLoss(SvmLoss.valueOf(solver)).withTolerance(tolerance);
        return new SvmTrainer(config).train(x, labels, 2, 7L);
    }

    @Benchmark
    public Model reference() {
        SolverType type = switch (solver) {
            case "LOGISTIC" -> SolverType.L2R_LR_DUAL;
            case "HINGE" -> SolverType.L2R_L1LOSS_SVC_DUAL;
            default -> SolverType.L2R_L2LOSS_SVC_DUAL;
        };
        return Linear.train(problem, new Parameter(type, 1.0, tolerance));
    }
}
