package dev.pressmark.core.bench;

import dev.pressmark.core.drift.DriftProfile;
import dev.pressmark.core.drift.DriftReport;
import dev.pressmark.core.drift.DriftWindow;
import dev.pressmark.core.drift.LengthSummary;
import java.util.ArrayList;
import java.util.List;
import java.util.OptionalLong;
import java.util.SplittableRandom;
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
import org.openjdk.jmh.annotations.Threads;
import org.openjdk.jmh.annotations.Warmup;

/**
 * The drift window's two costs, one thread: adding one tokenised item of 12 tokens (the tap's
 * thread pays it, not the request) and a report over a full window of 2,000 items against 200 top
 * features (each drift request and each scrape of the drift gauges pays it). Invented tokens.
 *
 * <pre>mvn -q -pl model-core -Pbench test-compile exec:exec -Djmh.args="DriftBenchmark"</pre>
 */
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MICROSECONDS)
@Warmup(iterations = 2, time = 2)
@Measurement(iterations = 3, time = 2)
@Fork(1)
@Threads(1)
public class DriftBenchmark {

    private static final int TOP = 200;
    private static final int VOCABULARY = 400;

    @State(Scope.Benchmark)
    public static class Window {
        DriftWindow window;
        List<List<List<String>>> items;
        int next;

        @Setup(Level.Trial)
        public void setUp() {
            List<DriftProfile.TopFeature> top = new ArrayList<>();
            for (int j = 0; j < TOP; j++) {
                top.add(new DriftProfile.TopFeature("title:t" + j, 1_000 - 4 * j));
            }
            DriftProfile profile = new DriftProfile(2_000, 24_000, 0.01, new LengthSummary(12.0, 8, 12, 16), top, OptionalLong.of(200_000));
            window = new DriftWindow(profile, List.of("title"), DriftWindow.DEFAULT_CAPACITY);
            SplittableRandom random = new SplittableRandom(3);
            items = new ArrayList<>();
            for (int i = 0; i < 4_096; i++) {
                List<String> tokens = new ArrayList<>();
                for (int t = 0; t < 12; t++) {
                    tokens.add("t" + random.nextInt(VOCABULARY));
                }
                items.add(List.of(tokens));
            }
            for (int i = 0; i < DriftWindow.DEFAULT_CAPACITY; i++) {
                window.add(items.get(i), 0);
            }
        }
    }

    @Benchmark
    public int add_one_item(Window w) {
        w.window.add(w.items.get(w.next++ & 4_095), 0);
        return w.next;
    }

    @Benchmark
    public DriftReport report_a_full_window(Window w) {
        return w.window.report();
    }
}
