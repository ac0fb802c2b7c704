package dev.pressmark.core.evaluate;

import static org.assertj.core.api.Assertions.assertThat;

import dev.pressmark.core.bundle.Manifest;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.HashSet;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.SplittableRandom;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.constraints.IntRange;
import org.junit.jupiter.api.Test;

/** The manifest's duplicate counts, by hand on a small case and against a naive count over strings. */
class DuplicateCountsTest {

    @Test
    void counts_a_hand_worked_split() {
        // rows:   0 a/x  1 a/x  2 b/x  3 a/y  4 c/x  5 b/x  6 c/x  7 d/y
        // train:  0, 1, 2, 3   test: 4, 5, 6, 7
        int[] texts = {0, 0, 1, 0, 2, 1, 2, 3};
        int[] labels = {0, 0, 0, 1, 0, 0, 0, 1};
        DuplicateCounts counts = DuplicateCounts.count(texts, labels, new Split(new int[] {0, 1, 2, 3}, new int[] {4, 5, 6, 7}),
                "keep", 0);
        // within train: text a on rows 0, 1, 3
        assertThat(counts.withinTrain()).isEqualTo(new DuplicateCounts.Tally(1, 3));
        // within test: text c on rows 4, 6
        assertThat(counts.withinTest()).isEqualTo(new DuplicateCounts.Tally(1, 2));
        // across: text b (train row 2, test row 5)
        assertThat(counts.acrossSplit()).isEqualTo(new DuplicateCounts.Tally(1, 1));
        // conflicting: text a has labels x and y, on rows 0, 1, 3
        assertThat(counts.conflictingLabels()).isEqualTo(new DuplicateCounts.Tally(1, 3));
    }

    @Test
    void the_summary_reads_in_the_singular_for_one_and_the_plural_otherwise() {
        // the same hand-worked split as above: one text in each count, 3, 2, 1 and 3 rows
        int[] texts = {0, 0, 1, 0, 2, 1, 2, 3};
        int[] labels = {0, 0, 0, 1, 0, 0, 0, 1};
        DuplicateCounts counts = DuplicateCounts.count(texts, labels, new Split(new int[] {0, 1, 2, 3}, new int[] {4, 5, 6, 7}),
                "drop", 1);
        assertThat(counts.summary()).isEqualTo("drop: 1 row dropped; 1 text repeated in training (3 rows), 1 text in test (2 rows),"
                + " 1 text across the split (1 test row), 1 text with conflicting labels (3 rows)");
    }

    @Test
    void survives_the_round_trip_through_the_manifest() {
        DuplicateCounts counts = new DuplicateCounts("drop", 7, new DuplicateCounts.Tally(2, 5), new DuplicateCounts.Tally(0, 0),
                new DuplicateCounts.Tally(3, 4), new DuplicateCounts.Tally(1, 2));
        Manifest read = Manifest.parse("{\"name\": \"m\", \"duplicates\": " + counts.toJson() + "}");

        assertThat(read.duplicates()).contains(counts);
        assertThat(read.toJson().get(DuplicateCounts.KEY)).isEqualTo(counts.toJson());
        assertThat(counts.toJson().path("across_split").path("test_rows").asInt()).isEqualTo(4);
        assertThat(Manifest.parse("{\"name\": \"m\"}").duplicates()).isEmpty();
    }

    @Property(tries = 300)
    void every_count_agrees_with_a_naive_count_over_the_texts(
            @ForAll long seed, @ForAll @IntRange(min = 1, max = 60) int rows, @ForAll @IntRange(min = 1, max = 12) int distinct) {
        SplittableRandom random = new SplittableRandom(seed);
        String[] text = new String[rows];
        String[] label = new String[rows];
        boolean[] test = new boolean[rows];
        List<Integer> train = new ArrayList<>();
        List<Integer> held = new ArrayList<>();
        for (int i = 0; i < rows; i++) {
            text[i] = "t" + random.nextInt(distinct);
            label[i] = random.nextInt(4) == 0 ? "y" : "x";
            test[i] = random.nextInt(3) == 0;
            (test[i] ? held : train).add(i);
        }
        Map<String, Integer> ids = new HashMap<>();
        int[] textIds = new int[rows];
        int[] labelIds = new int[rows];
        for (int i = 0; i < rows; i++) {
            textIds[i] = ids.computeIfAbsent(text[i], t -> ids.size());
            labelIds[i] = label[i].equals("x") ? 0 : 1;
        }
        DuplicateCounts counts = DuplicateCounts.count(textIds, labelIds,
                new Split(train.stream().mapToInt(Integer::intValue).toArray(), held.stream().mapToInt(Integer::intValue).toArray()),
                "keep", 0);

        Map<String, Integer> trainCount = new HashMap<>();
        Map<String, Integer> testCount = new HashMap<>();
        Map<String, Set<String>> labelsOf = new HashMap<>();
        for (int i = 0; i < rows; i++) {
            (test[i] ? testCount : trainCount).merge(text[i], 1, Integer::sum);
            labelsOf.computeIfAbsent(text[i], t -> new HashSet<>()).add(label[i]);
        }
        assertThat(counts.withinTrain()).isEqualTo(repeated(trainCount));
        assertThat(counts.withinTest()).isEqualTo(repeated(testCount));
        int acrossTexts = 0;
        int acrossRows = 0;
        for (Map.Entry<String, Integer> entry : testCount.entrySet()) {
            if (trainCount.containsKey(entry.getKey())) {
                acrossTexts++;
                acrossRows += entry.getValue();
            }
        }
        assertThat(counts.acrossSplit()).isEqualTo(new DuplicateCounts.Tally(acrossTexts, acrossRows));
        int conflictTexts = 0;
        int conflictRows = 0;
        for (Map.Entry<String, Set<String>> entry : labelsOf.entrySet()) {
            if (entry.getValue().size() > 1) {
                conflictTexts++;
                conflictRows += trainCount.getOrDefault(entry.getKey(), 0) + testCount.getOrDefault(entry.getKey(), 0);
            }
        }
        assertThat(counts.conflictingLabels()).isEqualTo(new DuplicateCounts.Tally(conflictTexts, conflictRows));
    }

    private static DuplicateCounts.Tally repeated(Map<String, Integer> counts) {
        int texts = 0;
        int rows = 0;
        for (int count : counts.values()) {
            if (count > 1) {
                texts++;
                rows += count;
            }
        }
        return new DuplicateCounts.Tally(texts, rows);
    }
}
