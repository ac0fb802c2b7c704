package dev.pressmark.core.bench;

import dev.pressmark.core.evaluate.Fold;
import dev.pressmark.core.evaluate.GroupedFolds;
import dev.pressmark.core.evaluate.GroupedSplit;
import dev.pressmark.core.evaluate.Resampling;
import dev.pressmark.core.evaluate.Split;
import java.util.List;
import java.util.SplittableRandom;
import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Fork;
import org.openjdk.jmh.annotations.Measurement;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.Threads;
import org.openjdk.jmh.annotations.Warmup;

/**
 * What grouping costs the resampling itself: the grouped split and 5-fold against the ungrouped
 * ones on 100,000 invented rows of 20 classes in 20,000 groups (each group mostly of one class),
 * one thread.
 *
 * <pre>mvn -q -pl model-core -Pbench test-compile exec:exec -Djmh.args="GroupedResamplingBenchmark"</pre>
 */
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
@Warmup(iterations = 3, time = 2)
@Measurement(iterations = 5, time = 2)
@Fork(1)
@Threads(1)
public class GroupedResamplingBenchmark {

    private static final int ROWS = 100_000;
    private static final int CLASSES = 20;
    private static final int GROUPS = 20_000;

    @State(Scope.Benchmark)
    public static class Data {
        int[] labels;
        int[] groups;

        @Setup
        public void setUp() {
            SplittableRandom random = new SplittableRandom(11);
            labels = new int[ROWS];
            groups = new int[ROWS];
            for (int i = 0; i < ROWS; i++) {
                groups[i] = random.nextInt(GROUPS);
                labels[i] = random.nextDouble() < 0.8 ? groups[i] % CLASSES : random.nextInt(CLASSES);
            }
        }
    }

    @Benchmark
    public Split split(Data d) {
        return Resampling.stratifiedSplit(d.labels, CLASSES, 0.2, 7);
    }

    @Benchmark
    public GroupedSplit grouped_split(Data d) {
        return Resampling.groupedStratifiedSplit(d.labels, d.groups, CLASSES, 0.2, 7);
    }

    @Benchmark
    public List<Fold> five_folds(Data d) {
        return Resampling.stratifiedKFold(d.labels, CLASSES, 5, 1, 7);
    }

    @Benchmark
    public GroupedFolds grouped_five_folds(Data d) {
        return Resampling.groupedStratifiedKFold(d.labels, d.groups, CLASSES, 5, 1, 7);
    }
}
