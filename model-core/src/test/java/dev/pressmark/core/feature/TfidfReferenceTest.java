package dev.pressmark.core.feature;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;

/**
 * The worked example of the scikit-learn user guide, section "Tf–idf term weighting" (from memory):
 * six documents over three terms whose raw counts are {@link #COUNTS}, weighted by count × idf and
 * then l2-normalised. Our tfidf weighs {@code count / len} instead of the raw count; the per-row
 * factor {@code 1 / len} cancels in the l2 normalisation, so the rows must agree.
 */
class TfidfReferenceTest {

    private static final int[][] COUNTS = {{3, 0, 1}, {2, 0, 0}, {3, 0, 0}, {4, 0, 0}, {3, 2, 0}, {3, 0, 2}};

    /** The guide prints eight decimals, so agreement is to half a unit in the eighth place. */
    private static final double PRINTED = 5e-9;

    /** The guide's rows with {@code smooth_idf=True}, its default (from memory). */
    private static final double[][] SMOOTH_ROWS = {
        {0.85151335, 0, 0.52433293},
        {1, 0, 0},
        {1, 0, 0},
        {1, 0, 0},
        {0.55422893, 0.83236428, 0},
        {0.63035731, 0, 0.77630514},
    };

    private static final List<String> COLUMNS = List.of("text");
    private static final FeatureConfig TFIDF_L2 = new FeatureConfig(500, Weighting.TFIDF, Scaling.L2);

    @Test
    void smooth_tfidf_with_l2_reproduces_the_guides_rows() {
        List<List<List<String>>> rows = TokenRows.fromCounts(COUNTS);
        FeatureSpace space = FeatureSpace.fit(TFIDF_L2, COLUMNS, rows);

        double[][] actual = byTerm(space, space.transform(rows));

        for (int i = 0; i < SMOOTH_ROWS.length; i++) {
            assertThat(actual[i]).as("row %d", i).containsExactly(SMOOTH_ROWS[i], within(PRINTED));
        }
    }

    /**
     * The guide's counts under {@code sublinear_tf=True}, where a count {@code c} weighs
     * {@code 1 + ln c}; rows printed by scikit-learn 1.2.1 (Debian's python3-sklearn):
     * {@code /usr/bin/python3 -c "from sklearn.feature_extraction.text import TfidfTransformer;
     * print(TfidfTransformer(sublinear_tf=True).fit_transform(COUNTS).toarray())"} at ten decimals.
     * Row 0 by hand: (1 + ln 3) · 1 and 1 · (ln(7/3) + 1), l2-normalised, 0.7506 and 0.6607.
     */
    private static final double[][] SUBLINEAR_ROWS = {
        {0.750621438, 0, 0.6607325154},
        {1, 0, 0},
        {1, 0, 0},
        {1, 0, 0},
        {0.4820544823, 0.8761412421, 0},
        {0.5571694513, 0, 0.8303988214},
    };

    @Test
    void sublinear_smooth_tfidf_with_l2_reproduces_scikit_learns_rows() {
        List<List<List<String>>> rows = TokenRows.fromCounts(COUNTS);
        FeatureConfig sublinear = new FeatureConfig(500, Weighting.TFIDF, Scaling.L2, 1, true);
        FeatureSpace space = FeatureSpace.fit(sublinear, COLUMNS, rows);

        double[][] actual = byTerm(space, space.transform(rows));

        for (int i = 0; i < SUBLINEAR_ROWS.length; i++) {
            assertThat(actual[i]).as("row %d", i).containsExactly(SUBLINEAR_ROWS[i], within(PRINTED));
        }
        FeatureSpace stored = FeatureSpace.fromState(space.toState());
        assertThat(stored.toState().formatVersion()).isEqualTo(FeatureSpace.FORMAT_VERSION);
        assertThat(byTerm(stored, stored.transform(rows))).isDeepEqualTo(actual);
    }

    @Test
    void unsmoothed_idf_from_a_stored_state_reproduces_the_guides_first_row() {
        // The guide's smooth_idf=False variant: idf(t) = ln(n / df(t)) + 1; its first row is
        // [0.81940995, 0, 0.57320793] (from memory). A stored state may carry any positive idf, so the
        // same transform reproduces it when given those values.
        List<List<List<String>>> rows = TokenRows.fromCounts(COUNTS);
        FeatureSpace.State fitted = FeatureSpace.fit(TFIDF_L2, COLUMNS, rows).toState();
        List<Double> unsmoothed = new ArrayList<>();
        for (FeatureSpace.Feature feature : fitted.features()) {
            unsmoothed.add(Math.log((double) fitted.trainingRows() / feature.documentFrequency()) + 1);
        }
        FeatureSpace space = FeatureSpace.fromState(new FeatureSpace.State(fitted.formatVersion(), fitted.columns(),
                fitted.maxTokens(), fitted.weighting(), fitted.scaling(), fitted.trainingRows(), fitted.features(),
                unsmoothed, null, null));

        double[][] actual = byTerm(space, space.transform(rows.subList(0, 1)));

        assertThat(actual[0]).containsExactly(new double[] {0.81940995, 0, 0.57320793}, within(PRINTED));
    }

    @Test
    void the_idf_is_the_smooth_idf_of_the_counted_document_frequencies() {
        FeatureSpace space = FeatureSpace.fit(TFIDF_L2, COLUMNS, TokenRows.fromCounts(COUNTS));

        // Document frequencies read off the count matrix: term 0 in all six, term 1 in one, term 2 in two.
        assertThat(space.documentFrequency(space.indexOf("text", "t0"))).isEqualTo(6);
        assertThat(space.documentFrequency(space.indexOf("text", "t1"))).isEqualTo(1);
        assertThat(space.documentFrequency(space.indexOf("text", "t2"))).isEqualTo(2);
        // scikit-learn's smooth idf, ln((1 + n) / (1 + df)) + 1 (from memory).
        double[] idf = space.idf();
        assertThat(idf[space.indexOf("text", "t0")]).isEqualTo(1.0);
        assertThat(idf[space.indexOf("text", "t1")]).isCloseTo(Math.log(7.0 / 2.0) + 1, within(1e-15));
        assertThat(idf[space.indexOf("text", "t2")]).isCloseTo(Math.log(7.0 / 3.0) + 1, within(1e-15));
    }

    @Test
    void tfidf_without_scaling_is_the_count_over_the_length_times_the_idf() {
        FeatureSpace space = FeatureSpace.fit(TFIDF_L2.withScaling(Scaling.NONE), COLUMNS,
                TokenRows.fromCounts(COUNTS));

        double[][] actual = byTerm(space, space.transform(TokenRows.fromCounts(COUNTS)));

        // Row 0 has four tokens: three of term 0 (idf 1) and one of term 2 (idf ln(7/3) + 1).
        assertThat(actual[0]).containsExactly(new double[] {0.75, 0, 0.25 * (Math.log(7.0 / 3.0) + 1)},
                within(1e-15));
    }

    /** The rows of {@code x} with their columns put back in term order t0, t1, t2. */
    private static double[][] byTerm(FeatureSpace space, SparseMatrix x) {
        double[][] rows = new double[x.rows()][3];
        for (int i = 0; i < x.rows(); i++) {
            double[] dense = TokenRows.dense(x, i);
            for (int t = 0; t < 3; t++) {
                rows[i][t] = dense[space.indexOf("text", "t" + t)];
            }
        }
        return rows;
    }
}
