package dev.pressmark.core.feature;

import static dev.pressmark.core.feature.TokenRows.row;
import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.List;
import java.util.SplittableRandom;
import net.jqwik.api.Arbitrary;
import net.jqwik.api.Assume;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.Provide;
import org.apache.commons.math3.stat.descriptive.moment.Mean;
import org.apache.commons.math3.stat.descriptive.moment.StandardDeviation;
import org.junit.jupiter.api.Test;

/**
 * Column means and population standard deviations against Apache Commons Math 3's {@link Mean} and
 * {@link StandardDeviation} (bias-corrected off, i.e. divisor n), and the identities that let a
 * model trained on uncentred scaled rows be read as one on centred rows.
 */
class StandardizationTest {

    /** Means and deviations of at most 30 values of magnitude at most 12, summed in another order. */
    private static final double MOMENTS = 1e-12;
    /** Decision values: a few hundred products of magnitude up to about 30, in another order. */
    private static final double DECISIONS = 1e-9;

    private static final List<String> COLUMNS = TokenRows.TWO_COLUMNS;

    @Provide
    Arbitrary<List<List<List<String>>>> training() {
        return TokenRows.rows(30, 12);
    }

    /** Column {@code j} of the weighted rows, computed from the tokens, not by the space. */
    private static double[] referenceColumn(FeatureSpace space, List<List<List<String>>> rows, int j) {
        double[] counts = TokenRows.counts(rows, COLUMNS.indexOf(space.column(j)), space.token(j));
        double[] lengths = TokenRows.lengths(rows);
        double[] column = new double[rows.size()];
        for (int i = 0; i < rows.size(); i++) {
            column[i] = switch (space.config().weighting()) {
                case COUNT -> counts[i];
                case TF -> counts[i] == 0 ? 0 : counts[i] / lengths[i];
                // scikit-learn's smooth idf (common practice), as Weighting.TFIDF documents it.
                case TFIDF -> counts[i] == 0 ? 0 : counts[i] / lengths[i]
                        * (Math.log((1.0 + rows.size()) / (1.0 + space.documentFrequency(j))) + 1);
                case BINARY -> counts[i] > 0 ? 1 : 0;
            };
        }
        return column;
    }

    @Property(tries = 300)
    void means_and_deviations_agree_with_commons_math(@ForAll("training") List<List<List<String>>> rows,
            @ForAll Weighting weighting) {
        Assume.that(TokenRows.hasTokens(rows));
        FeatureSpace space = FeatureSpace.fit(new FeatureConfig(500, weighting, Scaling.STANDARDIZE), COLUMNS, rows);
        double[] means = space.means();
        double[] scales = space.scales();
        List<Double> deviations = space.toState().standardDeviations();

        for (int j = 0; j < space.featureCount(); j++) {
            double[] column = referenceColumn(space, rows, j);
            double sd = new StandardDeviation(false).evaluate(column);
            assertThat(means[j]).as("mean of %s", space.featureName(j))
                    .isCloseTo(new Mean().evaluate(column), within(MOMENTS));
            assertThat(deviations.get(j)).as("deviation of %s", space.featureName(j)).isCloseTo(sd, within(MOMENTS));
            if (scales[j] == 0) {
                assertThat(sd).as("a column scaled by 0 is constant").isLessThan(MOMENTS);
            } else {
                assertThat(scales[j] * sd).as("scale of %s", space.featureName(j)).isCloseTo(1.0, within(MOMENTS));
            }
        }
    }

    @Property(tries = 200)
    void standardized_training_columns_have_unit_deviation_or_are_zero(
            @ForAll("training") List<List<List<String>>> rows, @ForAll Weighting weighting) {
        Assume.that(TokenRows.hasTokens(rows));
        FeatureSpace space = FeatureSpace.fit(new FeatureConfig(500, weighting, Scaling.STANDARDIZE), COLUMNS, rows);
        SparseMatrix x = space.transform(rows);

        for (int j = 0; j < space.featureCount(); j++) {
            double[] column = TokenRows.column(x, j);
            if (space.scales()[j] == 0) {
                assertThat(column).containsOnly(0.0);
            } else {
                assertThat(new StandardDeviation(false).evaluate(column)).isCloseTo(1.0, within(MOMENTS));
            }
        }
    }

    @Property(tries = 200)
    void the_centred_intercept_is_the_mean_decision_value_over_the_training_rows(
            @ForAll("training") List<List<List<String>>> rows, @ForAll Weighting weighting, @ForAll long seed) {
        Assume.that(TokenRows.hasTokens(rows));
        FeatureSpace space = FeatureSpace.fit(new FeatureConfig(500, weighting, Scaling.STANDARDIZE), COLUMNS, rows);
        SplittableRandom random = new SplittableRandom(seed);
        double[] w = random.doubles(space.featureCount(), -1, 1).toArray();
        double b = random.nextDouble(-1, 1);
        SparseMatrix x = space.transform(rows);

        double[] decisions = new double[x.rows()];
        for (int i = 0; i < x.rows(); i++) {
            decisions[i] = x.dot(i, w) + b;
        }

        assertThat(space.centredIntercept(w, b)).isCloseTo(new Mean().evaluate(decisions), within(DECISIONS));
    }

    @Property(tries = 200)
    void a_model_on_scaled_rows_equals_its_centred_form_on_every_row(
            @ForAll("training") List<List<List<String>>> train, @ForAll("training") List<List<List<String>>> other,
            @ForAll Weighting weighting, @ForAll long seed) {
        Assume.that(TokenRows.hasTokens(train));
        FeatureConfig config = new FeatureConfig(500, weighting, Scaling.STANDARDIZE);
        FeatureSpace scaled = FeatureSpace.fit(config, COLUMNS, train);
        FeatureSpace unscaled = FeatureSpace.fit(config.withScaling(Scaling.NONE), COLUMNS, train);
        SplittableRandom random = new SplittableRandom(seed);
        double[] w = random.doubles(scaled.featureCount(), -1, 1).toArray();
        double b = random.nextDouble(-1, 1);
        double[] mu = scaled.means();
        double[] s = scaled.scales();
        double centred = scaled.centredIntercept(w, b);
        SparseMatrix xs = scaled.transform(other);
        SparseMatrix xu = unscaled.transform(other);

        for (int i = 0; i < other.size(); i++) {
            double[] raw = TokenRows.dense(xu, i);
            double[] rowScaled = TokenRows.dense(xs, i);
            double centredForm = centred;
            for (int j = 0; j < raw.length; j++) {
                assertThat(rowScaled[j]).isCloseTo(raw[j] * s[j], within(1e-15 * Math.abs(raw[j] * s[j])));
                centredForm += w[j] * (raw[j] - mu[j]) * s[j];
            }
            assertThat(xs.dot(i, w) + b).as("row %d", i).isCloseTo(centredForm, within(DECISIONS));
        }
    }

    @Test
    void a_column_constant_over_the_training_rows_is_scaled_to_zero() {
        // "brass" once in every title: mean 1, deviation 0. "tap" counts 1, 0, 2, 1: mean 1 and
        // population variance (0 + 1 + 1 + 0) / 4 = 0.5 (worked by hand).
        List<List<List<String>>> rows = List.of(row("brass tap", ""), row("brass", ""), row("brass tap tap", ""),
                row("tap brass", ""));
        FeatureSpace space = FeatureSpace.fit(new FeatureConfig(500, Weighting.COUNT, Scaling.STANDARDIZE),
                List.of("title", "body"), rows);
        int brass = space.indexOf("title", "brass");
        int tap = space.indexOf("title", "tap");

        assertThat(space.means()).containsExactly(1.0, 1.0);
        assertThat(space.scales()[brass]).isZero();
        assertThat(space.scales()[tap]).isCloseTo(1 / Math.sqrt(0.5), within(1e-15));
        SparseMatrix x = space.transform(rows);
        assertThat(TokenRows.column(x, brass)).containsOnly(0.0);
        assertThat(x.nonZeros()).as("no stored zeros").isEqualTo(3);
    }

    @Test
    void without_standardization_the_centred_intercept_is_the_intercept() {
        List<List<List<String>>> rows = List.of(row("brass tap", "a"), row("brass", "b"));
        for (Scaling scaling : new Scaling[] {Scaling.L2, Scaling.NONE}) {
            FeatureSpace space = FeatureSpace.fit(new FeatureConfig(500, Weighting.TF, scaling), COLUMNS, rows);

            assertThat(space.means()).containsOnly(0.0);
            assertThat(space.scales()).containsOnly(1.0);
            assertThat(space.centredIntercept(new double[space.featureCount()], 0.25)).isEqualTo(0.25);
        }
    }
}
