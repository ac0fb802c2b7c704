package dev.pressmark.core.feature;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.ArrayList;
import java.util.Comparator;
import java.util.HashSet;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.SplittableRandom;
import java.util.TreeMap;
import net.jqwik.api.Arbitrary;
import net.jqwik.api.Assume;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.Provide;
import net.jqwik.api.constraints.IntRange;
import org.apache.commons.math3.util.MathArrays;

class FeatureSpacePropertiesTest {

    private static final List<String> COLUMNS = TokenRows.TWO_COLUMNS;
    /** A token that the generated rows never hold. */
    private static final String PLANTED = "held-out-only";

    @Provide
    Arbitrary<List<List<List<String>>>> training() {
        return TokenRows.rows(25, 6);
    }

    /** Document frequency by feature name, counted the slow way. */
    private static Map<String, Integer> documentFrequencies(List<List<List<String>>> rows) {
        Map<String, Set<Integer>> holders = new TreeMap<>();
        for (int i = 0; i < rows.size(); i++) {
            for (int c = 0; c < COLUMNS.size(); c++) {
                for (String token : rows.get(i).get(c)) {
                    holders.computeIfAbsent(COLUMNS.get(c) + ":" + token, k -> new HashSet<>()).add(i);
                }
            }
        }
        Map<String, Integer> df = new TreeMap<>();
        holders.forEach((name, set) -> df.put(name, set.size()));
        return df;
    }

    private static List<String> names(FeatureSpace space) {
        List<String> names = new ArrayList<>();
        for (int j = 0; j < space.featureCount(); j++) {
            names.add(space.featureName(j));
        }
        return names;
    }

    @Property(tries = 300)
    void selects_the_most_frequent_features_by_document_frequency_then_name(
            @ForAll("training") List<List<List<String>>> rows, @ForAll @IntRange(min = 1, max = 30) int maxTokens) {
        Assume.that(TokenRows.hasTokens(rows));
        Map<String, Integer> df = documentFrequencies(rows);
        List<String> expected = df.keySet().stream()
                .sorted(Comparator.comparing((String name) -> -df.get(name)).thenComparing(Comparator.naturalOrder()))
                .limit(maxTokens)
                .toList();

        FeatureSpace space = FeatureSpace.fit(new FeatureConfig(maxTokens, Weighting.TF, Scaling.L2), COLUMNS, rows);

        assertThat(space.featureCount()).isEqualTo(Math.min(maxTokens, df.size()));
        assertThat(names(space)).containsExactlyElementsOf(expected);
        for (int j = 0; j < space.featureCount(); j++) {
            assertThat(space.documentFrequency(j)).isEqualTo(df.get(space.featureName(j)));
        }
    }

    @Property(tries = 300)
    void l2_rows_are_the_weighted_rows_over_their_norm(@ForAll("training") List<List<List<String>>> train,
            @ForAll("training") List<List<List<String>>> other, @ForAll Weighting weighting,
            @ForAll @IntRange(min = 1, max = 12) int maxTokens) {
        Assume.that(TokenRows.hasTokens(train));
        FeatureConfig config = new FeatureConfig(maxTokens, weighting, Scaling.L2);
        SparseMatrix normalized = FeatureSpace.fit(config, COLUMNS, train).transform(other);
        SparseMatrix weighted = FeatureSpace.fit(config.withScaling(Scaling.NONE), COLUMNS, train).transform(other);

        for (int i = 0; i < other.size(); i++) {
            double[] raw = TokenRows.dense(weighted, i);
            // Commons Math's overflow-safe Euclidean norm (MathArrays.safeNorm) as the reference.
            double norm = MathArrays.safeNorm(raw);
            double[] expected = new double[raw.length];
            for (int j = 0; j < raw.length; j++) {
                expected[j] = norm == 0 ? 0 : raw[j] / norm;
            }
            assertThat(TokenRows.dense(normalized, i)).containsExactly(expected, within(1e-15));
            assertThat(MathArrays.safeNorm(TokenRows.dense(normalized, i)))
                    .isCloseTo(norm == 0 ? 0 : 1, within(1e-15));
        }
    }

    @Property(tries = 200)
    void fitting_does_not_depend_on_the_order_of_the_training_rows(@ForAll("training") List<List<List<String>>> rows,
            @ForAll Weighting weighting, @ForAll Scaling scaling, @ForAll @IntRange(min = 1, max = 12) int maxTokens,
            @ForAll long seed) {
        Assume.that(TokenRows.hasTokens(rows));
        List<List<List<String>>> shuffled = new ArrayList<>(rows);
        SplittableRandom random = new SplittableRandom(seed);
        for (int j = shuffled.size() - 1; j > 0; j--) {
            shuffled.set(j, shuffled.set(random.nextInt(j + 1), shuffled.get(j)));
        }
        FeatureConfig config = new FeatureConfig(maxTokens, weighting, scaling);

        FeatureSpace.State a = FeatureSpace.fit(config, COLUMNS, rows).toState();
        FeatureSpace.State b = FeatureSpace.fit(config, COLUMNS, shuffled).toState();

        assertThat(b.features()).isEqualTo(a.features());
        assertThat(b.idf()).isEqualTo(a.idf());
        // Means and deviations are sums taken in another order: equal up to rounding.
        if (scaling == Scaling.STANDARDIZE) {
            for (int j = 0; j < a.means().size(); j++) {
                assertThat(b.means().get(j)).isCloseTo(a.means().get(j), within(1e-12));
                assertThat(b.standardDeviations().get(j)).isCloseTo(a.standardDeviations().get(j), within(1e-12));
            }
        }
    }

    @Property(tries = 200)
    void a_row_transforms_the_same_alone_in_a_batch_and_every_time(@ForAll("training") List<List<List<String>>> train,
            @ForAll("training") List<List<List<String>>> other, @ForAll Weighting weighting, @ForAll Scaling scaling,
            @ForAll @IntRange(min = 1, max = 12) int maxTokens) {
        Assume.that(TokenRows.hasTokens(train));
        FeatureSpace space = FeatureSpace.fit(new FeatureConfig(maxTokens, weighting, scaling), COLUMNS, train);

        SparseMatrix batch = space.transform(other);
        SparseMatrix again = space.transform(other);
        for (int i = 0; i < other.size(); i++) {
            SparseMatrix alone = space.transform(List.of(other.get(i)));
            assertThat(TokenRows.dense(alone, 0)).containsExactly(TokenRows.dense(batch, i));
            assertThat(TokenRows.dense(again, i)).containsExactly(TokenRows.dense(batch, i));
        }
    }

    @Property(tries = 200)
    void fitting_on_a_subset_uses_only_that_subset(@ForAll("training") List<List<List<String>>> train,
            @ForAll("training") List<List<List<String>>> heldOut, @ForAll Weighting weighting, @ForAll Scaling scaling,
            @ForAll @IntRange(min = 1, max = 30) int maxTokens) {
        Assume.that(TokenRows.hasTokens(train));
        List<List<List<String>>> all = new ArrayList<>(train);
        for (List<List<String>> row : heldOut) {
            List<String> title = new ArrayList<>(row.get(0));
            title.add(PLANTED);
            all.add(List.of(title, row.get(1)));
        }
        FeatureConfig config = new FeatureConfig(maxTokens, weighting, scaling);

        FeatureSpace space = FeatureSpace.fit(config, COLUMNS, all.subList(0, train.size()));

        assertThat(space.indexOf("title", PLANTED)).isEqualTo(-1);
        assertThat(space.trainingRows()).isEqualTo(train.size());
        Map<String, Integer> df = documentFrequencies(train);
        for (int j = 0; j < space.featureCount(); j++) {
            assertThat(space.documentFrequency(j)).isEqualTo(df.get(space.featureName(j)));
        }
        assertThat(space.toState()).isEqualTo(FeatureSpace.fit(config, COLUMNS, List.copyOf(train)).toState());
    }
}
