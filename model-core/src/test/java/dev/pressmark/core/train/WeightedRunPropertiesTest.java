package dev.pressmark.core.train;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import dev.pressmark.core.Progress;
import dev.pressmark.core.classify.DecisionMargins;
import dev.pressmark.core.classify.LinearClassifier;
import dev.pressmark.core.evaluate.Metric;
import dev.pressmark.core.feature.SparseMatrix;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.SplittableRandom;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.constraints.IntRange;

/**
 * A whole training run with integer case weights is the run on the data with each row written
 * that many times: the weighted primal is the repeated rows' primal term for term, so both runs
 * reach one optimum and score the test part alike. The test part is a fixed test file (weighted,
 * or its rows repeated) so that both runs test the same rows; the pipeline is one whose features
 * do not depend on how often a row occurs (whole words, tf, l2 scaling, no cap, no idf), which is
 * what makes the two runs' inputs equal. Cross-validation is not compared: repeated rows make
 * other folds.
 */
class WeightedRunPropertiesTest {

    /** How far decision values of the two optima may differ at the solver tolerance below. */
    private static final double DECISION = 1e-3;
    /** Metrics of identical predictions and near-identical scores agree to rounding. */
    private static final double METRIC = 1e-9;

    private static final String[][] WORDS = {
        {"pipe", "valve", "drain", "tap"}, {"volt", "switch", "plug", "fuse"}, {"rake", "hose", "seed", "pot"}};
    private static final String[] SHARED = {"pro", "kit", "steel", "black", "set"};

    private record Rows(List<String> texts, List<String> labels, double[] weights) {

        static Rows draw(SplittableRandom random, int count, int classes) {
            List<String> texts = new ArrayList<>();
            List<String> labels = new ArrayList<>();
            double[] weights = new double[count];
            for (int i = 0; i < count; i++) {
                // the first rows go round the classes, so that every class has rows in every fold
                int k = i < 2 * classes ? i % classes : random.nextInt(classes);
                int other = random.nextInt(classes);
                texts.add(WORDS[k][random.nextInt(4)] + " " + WORDS[other][random.nextInt(4)] + " "
                        + SHARED[random.nextInt(SHARED.length)]);
                labels.add("class" + k);
                weights[i] = 1 + random.nextInt(3);
            }
            return new Rows(texts, labels, weights);
        }

        LabelledData weighted() {
            return data(texts, labels, weights);
        }

        LabelledData repeated() {
            List<String> someTexts = new ArrayList<>();
            List<String> someLabels = new ArrayList<>();
            for (int i = 0; i < texts.size(); i++) {
                for (int r = 0; r < (int) weights[i]; r++) {
                    someTexts.add(texts.get(i));
                    someLabels.add(labels.get(i));
                }
            }
            double[] ones = new double[someTexts.size()];
            Arrays.fill(ones, 1.0);
            return data(someTexts, someLabels, ones);
        }

        private static LabelledData data(List<String> texts, List<String> labels, double[] weights) {
            List<String[]> rows = new ArrayList<>();
            texts.forEach(text -> rows.add(new String[] {text}));
            int[] lines = new int[texts.size()];
            for (int i = 0; i < lines.length; i++) {
                lines[i] = i + 2;
            }
            return new LabelledData(List.of("text"), "label", rows, labels, lines, "0".repeat(64), 0, null, null, weights);
        }
    }

    @Property(tries = 12)
    void integer_case_weights_test_as_rows_repeated_that_often(
            @ForAll long seed, @ForAll @IntRange(min = 2, max = 3) int classes, @ForAll boolean logistic) {
        SplittableRandom random = new SplittableRandom(seed);
        Rows train = Rows.draw(random, 24 + random.nextInt(24), classes);
        Rows test = Rows.draw(random, 12 + random.nextInt(12), classes);
        TrainConfig config = TrainConfig.parse("data: {text: [text], label: label, weight: w}\n"
                + "tokenizer: {kind: words}\nfeatures: {max_tokens: all, weighting: tf, scaling: l2}\n"
                + "classifier: {kind: " + (logistic ? "logistic-regression" : "linear-svm") + ", c: 1.0, tolerance: 1e-8,"
                + " max_iterations: 100000}\nevaluation: {folds: 2, threads: 1}\n", "train.yaml");

        TrainingRun.Result weighted = TrainingRun.withTestData(config, train.weighted(), test.weighted()).run(Progress.NONE);
        TrainingRun.Result repeated = TrainingRun.withTestData(config, train.repeated(), test.repeated()).run(Progress.NONE);

        List<String[]> testRows = new ArrayList<>();
        test.texts().forEach(text -> testRows.add(new String[] {text}));
        double[][] a = decisions(weighted, testRows);
        double[][] b = decisions(repeated, testRows);
        boolean clear = true;
        for (int i = 0; i < a.length; i++) {
            for (int k = 0; k < a[i].length; k++) {
                assertThat(a[i][k]).as("test row %d, score %d", i, k).isCloseTo(b[i][k], within(DECISION));
            }
            clear &= DecisionMargins.clearWinner(a[i], DECISION);
        }
        if (clear) {
            for (Metric metric : weighted.test().overall().metrics()) {
                assertThat(weighted.test().overall().get(metric)).as(metric.key())
                        .isCloseTo(repeated.test().overall().get(metric), within(METRIC));
            }
        }
    }

    private static double[][] decisions(TrainingRun.Result result, List<String[]> rows) {
        SparseMatrix x = result.pipeline().transform(rows);
        LinearClassifier model = result.model().classifier();
        double[][] out = new double[rows.size()][];
        for (int i = 0; i < out.length; i++) {
            out[i] = model.decisionValues(x, i);
        }
        return out;
    }
}
