package dev.pressmark.core.classify;

import de.bwaldvogel.liblinear.Linear;
import de.bwaldvogel.liblinear.Model;
import de.bwaldvogel.liblinear.Parameter;
import de.bwaldvogel.liblinear.Problem;
import de.bwaldvogel.liblinear.SolverType;
import dev.pressmark.core.feature.SparseMatrix;
import java.lang.management.ManagementFactory;
import java.lang.management.MemoryPoolMXBean;
import java.lang.management.MemoryType;
import java.util.Locale;
import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Fork;
import org.openjdk.jmh.annotations.Level;
import org.openjdk.jmh.annotations.Measurement;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.Warmup;

/**
 * Heap used by one squared-hinge SVM training on the synthetic problem of
 * {@link TimeToObjectiveBenchmark} (200,000 x 50,000, 20 non-zeros a row), ours against
 * LIBLINEAR's Java port (de.bwaldvogel:liblinear 2.44), each in a fresh JVM of its own with a fixed
 * 2 GiB heap. The benchmark's time is not the point; it prints, per solve:
 * <ul>
 *   <li>the input's own size: for ours the bytes of the CSR arrays, counted from their lengths, and
 *       for both the growth of the heap in use after a full collection when the input is built;</li>
 *   <li>the heap in use after a full collection just before the solve (input plus JVM and harness);</li>
 *   <li>the peak during the solve: after that collection every heap pool's peak is reset, and after
 *       the solve the pools' peaks are summed (no collection runs during either solve at this heap
 *       size, so the sum is the true peak);</li>
 *   <li>the bytes the solving thread allocated, from {@code com.sun.management.ThreadMXBean}.</li>
 * </ul>
 *
 * <pre>mvn -q -B -pl model-core -Pbench test-compile exec:exec -Djmh.args="SvmMemoryBenchmark"</pre>
 */
@BenchmarkMode(Mode.SingleShotTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
@Fork(value = 1, jvmArgsAppend = {"-Xms2g", "-Xmx2g", "-XX:+UseG1GC"})
@Warmup(iterations = 0)
@Measurement(iterations = 1)
public class SvmMemoryBenchmark {

    private static final double MIB = 1024.0 * 1024.0;

    /** Our input: the CSR matrix and the labels. */
    @State(Scope.Thread)
    public static class Ours {
        SparseMatrix x;
        int[] labels;

        @Setup(Level.Trial)
        public void setUp() {
            long before = usedAfterCollection();
            ReferenceComparison.Data data = TimeToObjectiveBenchmark.data("SYNTHETIC");
            x = data.train();
            labels = data.trainLabels();
            long grown = usedAfterCollection() - before;
            long csr = 4L * (x.rows() + 1) + 4L * x.nonZeros() + 8L * x.nonZeros();
            System.out.printf(Locale.ROOT, "%nours: CSR arrays %.1f MiB (row starts %d ints, columns %d ints, "
                    + "values %d doubles), labels %.1f MiB; heap grew by %.1f MiB when the input was built%n",
                    csr / MIB, x.rows() + 1, x.nonZeros(), x.nonZeros(), 4.0 * labels.length / MIB, grown / MIB);
        }
    }

    /** The reference's input: one array of feature objects per row. */
    @State(Scope.Thread)
    public static class Reference {
        Problem problem;

        @Setup(Level.Trial)
        public void setUp() {
            long before = usedAfterCollection();
            ReferenceComparison.Data data = TimeToObjectiveBenchmark.data("SYNTHETIC");
            problem = TimeToObjectiveBenchmark.referenceProblem(data.train(), data.trainLabels());
            // Let the collection below free our CSR copy, which the reference does not keep.
            data = null;
            long grown = usedAfterCollection() - before;
            System.out.printf(Locale.ROOT, "%nreference: heap grew by %.1f MiB when the input was built%n",
                    grown / MIB);
        }
    }

    @Benchmark
    public SvmModel ours(Ours input) {
        Probe start = startProbe();
        SvmModel model = new SvmTrainer(SvmConfig.defaults().withC(TimeToObjectiveBenchmark.C)
                .withBias(TimeToObjectiveBenchmark.BIAS)).train(input.x, input.labels, 2, TimeToObjectiveBenchmark.SEED);
        endProbe("ours", start);
        return model;
    }

    @Benchmark
    public Model reference(Reference input) {
        Probe start = startProbe();
        Model model = Linear.train(input.problem, new Parameter(SolverType.L2R_L2LOSS_SVC_DUAL,
                TimeToObjectiveBenchmark.C, TimeToObjectiveBenchmark.REFERENCE_TOLERANCE));
        endProbe("reference", start);
        return model;
    }

    /** This thread's allocated bytes and the JVM's collection count at the start of a solve. */
    private record Probe(long allocatedBytes, long collections) {
    }

    /** Collects, resets the heap pools' peaks and notes the allocation and collection counters. */
    private static Probe startProbe() {
        long used = usedAfterCollection();
        System.out.printf(Locale.ROOT, "heap in use after a full collection before the solve: %.1f MiB%n", used / MIB);
        for (MemoryPoolMXBean pool : ManagementFactory.getMemoryPoolMXBeans()) {
            if (pool.getType() == MemoryType.HEAP) {
                pool.resetPeakUsage();
            }
        }
        return new Probe(allocatedBytes(), collections());
    }

    private static void endProbe(String who, Probe start) {
        long allocated = allocatedBytes() - start.allocatedBytes();
        long collections = collections() - start.collections();
        long peak = 0;
        StringBuilder pools = new StringBuilder();
        for (MemoryPoolMXBean pool : ManagementFactory.getMemoryPoolMXBeans()) {
            if (pool.getType() == MemoryType.HEAP) {
                long poolPeak = pool.getPeakUsage().getUsed();
                peak += poolPeak;
                pools.append(String.format(Locale.ROOT, ", %s %.1f", pool.getName(), poolPeak / MIB));
            }
        }
        System.out.printf(Locale.ROOT, "%s: heap peak during the solve %.1f MiB (%s); allocated by the solve "
                + "%.1f MiB; collections during the solve %d%n", who, peak / MIB, pools.substring(2),
                allocated / MIB, collections);
    }

    private static long collections() {
        long count = 0;
        for (var gc : ManagementFactory.getGarbageCollectorMXBeans()) {
            count += gc.getCollectionCount();
        }
        return count;
    }

    private static long usedAfterCollection() {
        System.gc();
        System.gc();
        long used = 0;
        for (MemoryPoolMXBean pool : ManagementFactory.getMemoryPoolMXBeans()) {
            if (pool.getType() == MemoryType.HEAP) {
                used += pool.getUsage().getUsed();
            }
        }
        return used;
    }

    private static long allocatedBytes() {
        var threads = (com.sun.management.ThreadMXBean) ManagementFactory.getThreadMXBean();
        return threads.getThreadAllocatedBytes(Thread.currentThread().getId());
    }
}
