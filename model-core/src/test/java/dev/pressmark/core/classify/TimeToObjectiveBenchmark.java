package dev.pressmark.core.classify;

import de.bwaldvogel.liblinear.Linear;
import de.bwaldvogel.liblinear.Model;
import de.bwaldvogel.liblinear.Parameter;
import de.bwaldvogel.liblinear.Problem;
import de.bwaldvogel.liblinear.SolverType;
import dev.pressmark.core.feature.SparseMatrix;
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
 * Time for the squared-hinge SVM (c 1, bias 1) to reach the primal objective that LIBLINEAR's Java
 * port (de.bwaldvogel:liblinear 2.44, {@code -s 1 -B 1}) reaches at its default tolerance 0.1,
 * both measured in the same run on the same rows.
 *
 * <p>The setup trains the reference once at 0.1 and takes its primal objective {@code f_L}; it then
 * trains ours at tolerance 0.1 and, while ours ends above {@code f_L}, at ever tighter tolerances,
 * and keeps the first tolerance whose objective is at most {@code f_L}. Both objectives come from
 * {@link SvmSolver#primalObjective}. {@code ours} times a training at that tolerance,
 * {@code oursAtDefaultTolerance} one at 0.1 whatever its objective, {@code reference} the
 * reference at 0.1 on input built once outside the measurement. Each solve takes the same seed,
 * and the reference draws its order from a generator made per {@link Parameter}, so every
 * iteration repeats the solve the setup measured.
 *
 * <p>Problems: {@code SYNTHETIC}, 200,000 rows x 50,000 columns, 20 non-zeros a row, from
 * {@link SyntheticProblem}; {@code MAIL}, the spam-or-ham training split of {@link SpamCorpus}
 * (the features of {@link LiblinearSpamAssassinTest}).
 *
 * <pre>mvn -q -B -pl model-core -Pbench test-compile exec:exec -Djmh.args="TimeToObjectiveBenchmark"</pre>
 */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.SingleShotTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
@Fork(value = 1, jvmArgsAppend = {"-Xms4g", "-Xmx4g"})
@Warmup(iterations = 3)
@Measurement(iterations = 7)
public class TimeToObjectiveBenchmark {

    static final double C = 1.0;
    static final double BIAS = 1.0;
    /** LIBLINEAR's default stopping tolerance for its dual solvers. */
    static final double REFERENCE_TOLERANCE = 0.1;
    static final long SEED = 7L;
    /** The tolerances ours tries, loosest first, until its objective is at most the reference's. */
    private static final double[] TOLERANCES = {0.1, 0.07, 0.05, 0.03, 0.02, 0.01, 0.005, 0.002, 0.001};

    @Param({"SYNTHETIC", "MAIL"})
    public String problem;

    private SparseMatrix x;
    private int[] labels;
    private Problem referenceProblem;
    private SvmConfig toObjective;

    @Setup(Level.Trial)
    public void setUp() {
        ReferenceComparison.Data data = data(problem);
        x = data.train();
        labels = data.trainLabels();
        referenceProblem = referenceProblem(x, labels);
        double[] cost = Objectives.costs(labels, C, null);
        SvmConfig config = SvmConfig.defaults().withC(C).withBias(BIAS);
        Liblinear.Fit reference = Liblinear.train(x, labels, 2, BIAS, SolverType.L2R_L2LOSS_SVC_DUAL, C,
                REFERENCE_TOLERANCE, null);
        double referenceObjective = Objectives.svm(x, labels, 2, 0, cost, config, reference.weights()[0]);
        System.out.printf(Locale.ROOT, "%n%s: %s; reference objective at tolerance %s: %.6f%n", problem, x,
                REFERENCE_TOLERANCE, referenceObjective);
        for (double tolerance : TOLERANCES) {
            SvmConfig candidate = config.withTolerance(tolerance);
            SvmModel model = new SvmTrainer(candidate).train(x, labels, 2, SEED);
            double objective = Objectives.svm(x, labels, 2, 0, cost, candidate, model.weights().vector(0));
            System.out.printf(Locale.ROOT, "%s: ours at tolerance %s: objective %.6f (ours / reference %.6f), "
                    + "%d passes%n", problem, tolerance, objective, objective / referenceObjective,
                    model.convergence().maxIterations());
            if (objective <= referenceObjective) {
                toObjective = candidate;
                return;
            }
        }
        throw new IllegalStateException("ours did not reach the reference objective " + referenceObjective
                + " at tolerance " + TOLERANCES[TOLERANCES.length - 1]);
    }

    static ReferenceComparison.Data data(String problem) {
        if (problem.equals("SYNTHETIC")) {
            SyntheticProblem.Split split = SyntheticProblem.generate(42L, 200_000, 1, 50_000, 20, 2, 0.05);
            return new ReferenceComparison.Data(split.train().x(), split.train().labels(), split.test().x(),
                    split.test().labels(), 2);
        }
        SpamCorpus.Corpus corpus = SpamCorpus.load();
        return new ReferenceComparison.Data(corpus.train().x(), corpus.train().spam(), corpus.test().x(),
                corpus.test().spam(), 2);
    }

    static Problem referenceProblem(SparseMatrix x, int[] labels) {
        Linear.disableDebugOutput();
        Problem p = new Problem();
        p.l = x.rows();
        p.n = x.columns() + 1;
        p.bias = BIAS;
        p.x = Liblinear.rows(x, BIAS);
        p.y = new double[labels.length];
        for (int i = 0; i < labels.length; i++) {
            p.y[i] = labels[i];
        }
        return p;
    }

    @Benchmark
    public SvmModel ours() {
        return new SvmTrainer(toObjective).train(x, labels, 2, SEED);
    }

    @Benchmark
    public SvmModel oursAtDefaultTolerance() {
        return new SvmTrainer(toObjective.withTolerance(REFERENCE_TOLERANCE)).train(x, labels, 2, SEED);
    }

    @Benchmark
    public Model reference() {
        return Linear.train(referenceProblem, new Parameter(SolverType.L2R_L2LOSS_SVC_DUAL, C, REFERENCE_TOLERANCE));
    }
}
