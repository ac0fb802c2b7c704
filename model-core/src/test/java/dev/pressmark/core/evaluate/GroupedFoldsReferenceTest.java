package dev.pressmark.core.evaluate;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.io.InputStream;
import java.util.List;
import org.junit.jupiter.api.Test;

/**
 * The class balance of our grouped folds against scikit-learn's {@code StratifiedGroupKFold} on
 * the same generated labels and groups. The data and scikit-learn's figures were written by
 * {@code /usr/bin/python3 scripts/sklearn-group-folds-reference.py >
 * model-core/src/test/resources/reference/sklearn-group-folds.json} with scikit-learn 1.2.1
 * (Debian's python3-sklearn). The figure is {@link ClassBalance#meanLargestDeviation}: the mean
 * over folds of the largest gap between a class's share of the fold and of all rows.
 *
 * <p>We compare against the better of scikit-learn's two correct variants (its deterministic
 * greedy, and the greedy with a seeded random order as its 2025 fix of {@code shuffle=True} does;
 * the script says why 1.2.1's own {@code shuffle=True} is not stratified, and its figure is only
 * checked to be worse), each ours averaged over 10 repeats of one seed as theirs over 10 seeds.
 */
class GroupedFoldsReferenceTest {

    /**
     * Ours may be worse than the better reference by at most 0.005, half a percentage point of a
     * class's share: a greedy with another spread measure and order cannot match the other row for
     * row, and half a point is below what one row moves in a fold of 100 rows (1 point); it is
     * also a tenth of the gap to 1.2.1's unstratified shuffle on these sets.
     */
    private static final double MARGIN = 0.005;

    private static final int REPEATS = 10;

    @Test
    void our_grouped_folds_are_balanced_no_worse_than_scikit_learns_by_the_margin() throws IOException {
        JsonNode reference;
        try (InputStream in = getClass().getResourceAsStream("/reference/sklearn-group-folds.json")) {
            reference = new ObjectMapper().readTree(in);
        }
        assertThat(reference.path("source").asText()).startsWith("scikit-learn 1.2");
        int checked = 0;
        for (JsonNode c : reference.path("cases")) {
            int[] labels = ints(c.path("labels"));
            int[] groups = ints(c.path("groups"));
            int k = c.path("class_count").asInt();
            List<Fold> folds = Resampling.groupedStratifiedKFold(labels, groups, k, c.path("folds").asInt(), REPEATS, 7)
                    .folds();
            double ours = ClassBalance.meanLargestDeviation(labels, k, folds);
            double best = Math.min(c.path("no_shuffle").asDouble(), c.path("fixed_shuffle").asDouble());
            String figures = String.format("%s: ours %.4f, scikit-learn's greedy %.4f, with a random order %.4f,"
                    + " 1.2.1 shuffle=True %.4f", c.path("name").asText(), ours, c.path("no_shuffle").asDouble(),
                    c.path("fixed_shuffle").asDouble(), c.path("shuffle").asDouble());
            assertThat(ours).as(figures).isLessThanOrEqualTo(best + MARGIN);
            assertThat(ours).as(figures).isLessThan(c.path("shuffle").asDouble());
            checked++;
        }
        assertThat(checked).isEqualTo(6);
    }

    private static int[] ints(JsonNode array) {
        int[] out = new int[array.size()];
        for (int i = 0; i < out.length; i++) {
            out[i] = array.get(i).asInt();
        }
        return out;
    }
}
