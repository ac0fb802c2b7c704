package dev.pressmark.core.evaluate;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.ArrayList;
import java.util.List;
import java.util.SplittableRandom;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.constraints.IntRange;
import org.tribuo.ImmutableOutputInfo;
import org.tribuo.MutableOutputInfo;
import org.tribuo.Prediction;
import org.tribuo.classification.Label;
import org.tribuo.classification.LabelFactory;
import org.tribuo.classification.evaluation.ConfusionMetrics;
import org.tribuo.classification.evaluation.LabelConfusionMatrix;
import org.tribuo.classification.evaluation.LabelEvaluationUtil;
import org.tribuo.evaluation.metrics.EvaluationMetric.Average;
import org.tribuo.evaluation.metrics.MetricTarget;
import org.tribuo.impl.ArrayExample;

/**
 * Agreement with Tribuo 4.3.2's classification evaluation (org.tribuo:tribuo-classification-core,
 * Apache-2.0) on random label vectors: its LabelConfusionMatrix for the counts and ConfusionMetrics
 * for accuracy and per-class and macro precision, recall and F1 (Tribuo also defines 0/0 as 0 for
 * these, so classes that are never predicted take part), and LabelEvaluationUtil for each class's
 * one-vs-rest ROC AUC and average precision.
 */
class TribuoAgreementTest {

    /** Tribuo sums in doubles in another order; agreement beyond that is not expected. */
    private static final double TOLERANCE = 1e-9;

    @Property(tries = 200)
    void binary_metrics_agree_with_tribuo(@ForAll long seed, @ForAll @IntRange(min = 2, max = 200) int n) {
        check(seed, n, 2);
    }

    @Property(tries = 200)
    void multi_class_metrics_agree_with_tribuo(
            @ForAll long seed, @ForAll @IntRange(min = 3, max = 7) int k, @ForAll @IntRange(min = 7, max = 200) int n) {
        check(seed, n, k);
    }

    private static void check(long seed, int n, int k) {
        SplittableRandom random = new SplittableRandom(seed);
        int[] truth = Fixtures.labels(random, n, k);
        int[] predicted = Fixtures.noisyCopy(random, truth, k, random.nextDouble());
        double[] scores = new double[n * k];
        for (int i = 0; i < n; i++) {
            for (int c = 0; c < k; c++) {
                // Coarse grid: ties are frequent; the true class gets a boost half the time.
                scores[i * k + c] = (random.nextInt(6) + (truth[i] == c && random.nextBoolean() ? 2 : 0)) * 0.25;
            }
        }
        Evaluation ours = Evaluation.multiClass(truth, predicted, scores, k);

        Label[] labels = labels(k);
        LabelConfusionMatrix theirs = tribuoMatrix(truth, predicted, labels);

        for (int t = 0; t < k; t++) {
            for (int p = 0; p < k; p++) {
                assertThat((double) ours.confusion().count(t, p))
                        .as("count(truth %d, predicted %d)", t, p)
                        .isEqualTo(theirs.confusion(labels[p], labels[t]));
            }
        }
        assertThat(ours.overall().get(Metric.ACCURACY))
                .isCloseTo(ConfusionMetrics.accuracy(Average.MICRO, theirs), within(TOLERANCE));
        for (int c = 0; c < k; c++) {
            MetricTarget<Label> target = new MetricTarget<>(labels[c]);
            MetricValues mine = ours.perClass(c);
            assertThat(mine.get(Metric.PRECISION)).as("precision of class %d", c)
                    .isCloseTo(ConfusionMetrics.precision(target, theirs), within(TOLERANCE));
            assertThat(mine.get(Metric.SENSITIVITY)).as("recall of class %d", c)
                    .isCloseTo(ConfusionMetrics.recall(target, theirs), within(TOLERANCE));
            assertThat(mine.get(Metric.F1)).as("f1 of class %d", c)
                    .isCloseTo(ConfusionMetrics.f1(target, theirs), within(TOLERANCE));

            boolean[] positive = new boolean[n];
            double[] column = new double[n];
            for (int i = 0; i < n; i++) {
                positive[i] = truth[i] == c;
                column[i] = scores[i * k + c];
            }
            assertThat(mine.get(Metric.ROC_AUC)).as("roc_auc of class %d", c)
                    .isCloseTo(LabelEvaluationUtil.binaryAUCROC(positive, column),
                            within(TOLERANCE));
            assertThat(mine.get(Metric.PR_AUC)).as("pr_auc of class %d", c)
                    .isCloseTo(LabelEvaluationUtil.averagedPrecision(positive, column),
                            within(TOLERANCE));
        }
        MetricTarget<Label> macro = new MetricTarget<>(Average.MACRO);
        assertThat(ours.macro().get(Metric.PRECISION)).isCloseTo(ConfusionMetrics.precision(macro, theirs), within(TOLERANCE));
        assertThat(ours.macro().get(Metric.SENSITIVITY)).isCloseTo(ConfusionMetrics.recall(macro, theirs), within(TOLERANCE));
        assertThat(ours.macro().get(Metric.F1)).isCloseTo(ConfusionMetrics.f1(macro, theirs), within(TOLERANCE));
    }

    @Property(tries = 200)
    void binary_evaluation_of_the_positive_class_agrees_with_tribuo(@ForAll long seed,
            @ForAll @IntRange(min = 2, max = 200) int n, @ForAll @IntRange(min = 0, max = 1) int positiveClass) {
        SplittableRandom random = new SplittableRandom(seed);
        int[] truth = Fixtures.labels(random, n, 2);
        int[] predicted = Fixtures.noisyCopy(random, truth, 2, random.nextDouble());
        double[] scores = Fixtures.tiedScores(random, truth, positiveClass, 6);
        MetricValues ours = Evaluation.binary(truth, predicted, scores, positiveClass).overall();

        Label[] labels = labels(2);
        LabelConfusionMatrix theirs = tribuoMatrix(truth, predicted, labels);
        MetricTarget<Label> target = new MetricTarget<>(labels[positiveClass]);
        boolean[] positive = new boolean[n];
        for (int i = 0; i < n; i++) {
            positive[i] = truth[i] == positiveClass;
        }
        assertThat(ours.get(Metric.ACCURACY)).isCloseTo(ConfusionMetrics.accuracy(Average.MICRO, theirs), within(TOLERANCE));
        assertThat(ours.get(Metric.PRECISION)).isCloseTo(ConfusionMetrics.precision(target, theirs), within(TOLERANCE));
        assertThat(ours.get(Metric.SENSITIVITY)).isCloseTo(ConfusionMetrics.recall(target, theirs), within(TOLERANCE));
        assertThat(ours.get(Metric.F1)).isCloseTo(ConfusionMetrics.f1(target, theirs), within(TOLERANCE));
        assertThat(ours.get(Metric.ROC_AUC))
                .isCloseTo(LabelEvaluationUtil.binaryAUCROC(positive, scores), within(TOLERANCE));
        assertThat(ours.get(Metric.PR_AUC))
                .isCloseTo(LabelEvaluationUtil.averagedPrecision(positive, scores), within(TOLERANCE));
    }

    private static Label[] labels(int k) {
        Label[] labels = new Label[k];
        for (int c = 0; c < k; c++) {
            labels[c] = new Label("class-" + c);
        }
        return labels;
    }

    /** Tribuo's table over a domain of all K labels, so that its macro averages run over K classes too. */
    private static LabelConfusionMatrix tribuoMatrix(int[] truth, int[] predicted, Label[] labels) {
        MutableOutputInfo<Label> info = new LabelFactory().generateInfo();
        for (Label label : labels) {
            info.observe(label);
        }
        ImmutableOutputInfo<Label> domain = info.generateImmutableOutputInfo();
        List<Prediction<Label>> predictions = new ArrayList<>(truth.length);
        for (int i = 0; i < truth.length; i++) {
            predictions.add(new Prediction<>(labels[predicted[i]], 0, new ArrayExample<>(labels[truth[i]])));
        }
        return new LabelConfusionMatrix(domain, predictions);
    }
}
