package dev.pressmark.core.bundle;

import static org.assertj.core.api.Assertions.assertThat;

import dev.pressmark.core.classify.CalibratedClassifier;
import dev.pressmark.core.classify.LinearWeights;
import dev.pressmark.core.classify.PlattScaling;
import dev.pressmark.core.classify.ProbabilisticClassifier;
import dev.pressmark.core.classify.StoredLinearModel;
import dev.pressmark.core.classify.StoredLogisticModel;
import dev.pressmark.core.feature.SparseMatrix;
import java.util.ArrayList;
import java.util.List;
import java.util.SplittableRandom;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.constraints.IntRange;

/**
 * The interleaved dot products give the bits of {@link LinearWeights#decisionValues} and the label
 * of {@link LinearWeights#predict} (the classifier's own row-by-row path is the reference), and
 * probabilities from those decision values are the bits of the classifier's own.
 */
class InterleavedWeightsTest {

    @Property(tries = 200)
    void decision_values_labels_and_probabilities_are_the_bits_of_the_row_by_row_path(
            @ForAll @IntRange(min = 2, max = 6) int classes, @ForAll @IntRange(min = 1, max = 300) int features,
            @ForAll long seed) {
        SplittableRandom random = new SplittableRandom(seed);
        int scores = classes == 2 ? 1 : classes;
        double[][] w = new double[scores][features + 1];
        for (double[] row : w) {
            for (int j = 0; j < row.length; j++) {
                // some exact zeros and ties, so that signs of zero and first-of-equal maxima are exercised
                row[j] = random.nextInt(5) == 0 ? 0.0 : random.nextInt(3) == 0 ? 1.0 : random.nextDouble(-3.0, 3.0);
            }
        }
        LinearWeights weights = LinearWeights.of(classes, random.nextBoolean() ? 1.0 : 0.0, w);
        List<PlattScaling> platt = new ArrayList<>();
        for (int k = 0; k < scores; k++) {
            platt.add(new PlattScaling(random.nextDouble(-5.0, 0.0), random.nextDouble(-1.0, 1.0)));
        }
        ProbabilisticClassifier calibrated = new CalibratedClassifier<>(new StoredLinearModel(weights), platt);
        ProbabilisticClassifier logistic = new StoredLogisticModel(weights);
        SparseMatrix x = randomRows(features, random);
        InterleavedWeights interleaved = new InterleavedWeights(weights);
        double[] scoresOut = new double[scores];
        for (int i = 0; i < x.rows(); i++) {
            int length = x.rowEnd(i) - x.rowStart(i);
            int[] cols = new int[length + 2];
            double[] vals = new double[length + 2];
            for (int k = 0; k < length; k++) {
                cols[k] = x.column(x.rowStart(i) + k);
                vals[k] = x.value(x.rowStart(i) + k);
            }
            interleaved.decisionValues(cols, vals, length, scoresOut);
            double[] expected = new double[scores];
            weights.decisionValues(x, i, expected);
            assertThat(bits(scoresOut)).as("row %d", i).isEqualTo(bits(expected));
            assertThat(LinearWeights.classOf(scoresOut)).isEqualTo(weights.predict(x, i));
            for (ProbabilisticClassifier classifier : List.of(calibrated, logistic)) {
                double[] p = new double[classes];
                classifier.probabilitiesOf(scoresOut, p);
                assertThat(bits(p)).isEqualTo(bits(classifier.probabilities(x, i)));
            }
        }
    }

    private static SparseMatrix randomRows(int features, SplittableRandom random) {
        SparseMatrix.Builder builder = SparseMatrix.builder(features);
        for (int i = 0; i < 20; i++) {
            int[] cols = random.ints(0, features).distinct().limit(random.nextInt(Math.min(features, 40) + 1)).sorted().toArray();
            double[] vals = new double[cols.length];
            for (int k = 0; k < vals.length; k++) {
                vals[k] = random.nextInt(6) == 0 ? -0.0 : random.nextDouble(-1.0, 1.0);
            }
            builder.addRow(cols, vals);
        }
        return builder.build();
    }

    private static long[] bits(double[] values) {
        long[] bits = new long[values.length];
        for (int k = 0; k < values.length; k++) {
            bits[k] = Double.doubleToRawLongBits(values[k]);
        }
        return bits;
    }
}
