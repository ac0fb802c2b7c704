package dev.pressmark.core.train;

import dev.pressmark.core.evaluate.DuplicateCounts;
import dev.pressmark.core.evaluate.GroupedSplit;
import dev.pressmark.core.evaluate.Resampling;
import dev.pressmark.core.evaluate.Split;
import dev.pressmark.core.text.TextNormalizer;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.TreeSet;
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
 * What the duplicate and group handling itself costs a training run on the 100,000 rows of
 * scripts/bench-grouping.sh (cities-country.csv of scripts/fetch-bench-data.sh, GeoNames place
 * names, CC-BY-4.0, then its first 17,876 names again in upper case): the text ids every run
 * computes, the duplicate counts, and the split plus 3-fold resampling without groups, with the
 * group column (random groups of 5 rows) and with the groups of identical texts. One thread. In
 * this package because the text ids and row groups are package-private.
 *
 * <pre>mvn -q -pl model-core -Pbench test-compile exec:exec -Djmh.args="DuplicateGroupingBenchmark"</pre>
 */
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
@Warmup(iterations = 3, time = 2)
@Measurement(iterations = 5, time = 2)
@Fork(1)
@Threads(1)
public class DuplicateGroupingBenchmark {

    private static final int ROWS = 100_000;
    private static final int FOLDS = 3;

    @State(Scope.Benchmark)
    public static class Data {
        List<String[]> texts;
        int[] labels;
        int classes;
        List<String> groupValues;
        int[] rowNumbers;
        List<TextNormalizer> normalizers;
        int[] textIds;

        @Setup
        public void setUp() {
            Path file = Path.of(System.getProperty("user.home"), ".cache", "pressmark", "bench-data", "cities-country.csv");
            LabelledData cities = LabelledData.read(file, List.of("text"), "label", false);
            texts = new ArrayList<>(cities.texts());
            List<String> labelNames = new ArrayList<>(cities.labels());
            for (int i = 0; texts.size() < ROWS; i++) {
                texts.add(new String[] {cities.texts().get(i)[0].toUpperCase(Locale.ROOT)});
                labelNames.add(cities.labels().get(i));
            }
            List<String> sorted = List.copyOf(new TreeSet<>(labelNames));
            classes = sorted.size();
            labels = new int[ROWS];
            groupValues = new ArrayList<>(ROWS);
            rowNumbers = new int[ROWS];
            for (int i = 0; i < ROWS; i++) {
                labels[i] = sorted.indexOf(labelNames.get(i));
                groupValues.add("g" + (i * 7919L % 20_000));
                rowNumbers[i] = i + 1;
            }
            normalizers = TextKeys.normalizers(List.of(TrainConfig.parse("tokenizer: {kind: char-ngrams, min_n: 1, max_n: 3}\n",
                    "bench.yaml")));
            textIds = TextKeys.of(texts, normalizers);
        }
    }

    @Benchmark
    public int[] text_ids(Data d) {
        return TextKeys.of(d.texts, d.normalizers);
    }

    @Benchmark
    public DuplicateCounts duplicate_counts(Data d) {
        return DuplicateCounts.count(d.textIds, d.labels, Resampling.stratifiedSplit(d.labels, d.classes, 0.25, 7), "keep", 0);
    }

    @Benchmark
    public Object resampling_without_groups(Data d) {
        Split split = Resampling.stratifiedSplit(d.labels, d.classes, 0.25, 7);
        return Resampling.stratifiedKFold(TrainingRun.select(d.labels, split.train()), d.classes, FOLDS, 1, 7);
    }

    @Benchmark
    public Object resampling_with_group_column(Data d) {
        return grouped(d, RowGroups.of(d.groupValues, d.rowNumbers));
    }

    @Benchmark
    public Object resampling_with_identical_texts(Data d) {
        return grouped(d, RowGroups.joined(null, d.textIds, d.texts));
    }

    private static Object grouped(Data d, RowGroups groups) {
        GroupedSplit grouped = Resampling.groupedStratifiedSplit(d.labels, groups.ids(), d.classes, 0.25, 7);
        int[] train = grouped.split().train();
        return Resampling.groupedStratifiedKFold(TrainingRun.select(d.labels, train), TrainingRun.select(groups.ids(), train),
                d.classes, FOLDS, 1, 7);
    }
}
