package dev.pressmark.core.evaluate;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.SplittableRandom;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.constraints.IntRange;
import org.junit.jupiter.api.Test;

class RowAssignmentsTest {

    @Test
    void test_rows_are_marked_and_training_rows_carry_the_fold_of_their_position() {
        // Rows 1 and 4 are the test side; training rows 0, 2, 3, 5 sit at positions 0..3.
        Split split = new Split(new int[] {0, 2, 3, 5}, new int[] {1, 4});
        List<Fold> folds = List.of(new Fold(0, 0, new int[] {1, 2}, new int[] {0, 3}),
                new Fold(0, 1, new int[] {0, 3}, new int[] {1, 2}),
                new Fold(1, 0, new int[] {0}, new int[] {1, 2, 3}));
        assertThat(RowAssignments.foldOfRow(6, split, folds)).containsExactly(0, RowAssignments.TEST, 1, 1,
                RowAssignments.TEST, 0);
    }

    @Test
    void a_training_row_in_no_fold_is_an_error_naming_it() {
        Split split = new Split(new int[] {0, 1}, new int[] {2});
        List<Fold> folds = List.of(new Fold(0, 0, new int[] {1}, new int[] {0}));
        assertThatThrownBy(() -> RowAssignments.foldOfRow(3, split, folds))
                .hasMessage("row 1 is in no fold of repeat 0 and not on the test side");
    }

    /** The grouped split and grouped folds over its training rows: a group has one part and one fold. */
    @Property(tries = 60)
    void after_a_grouped_split_and_grouped_folds_every_group_has_one_part_and_one_fold(
            @ForAll long seed, @ForAll @IntRange(min = 40, max = 300) int n, @ForAll @IntRange(min = 2, max = 4) int k) {
        SplittableRandom random = new SplittableRandom(seed);
        int[] labels = new int[n];
        int[] groups = new int[n];
        for (int row = 0; row < n; row++) {
            groups[row] = random.nextInt(n / 2);
            labels[row] = row < k ? row : random.nextInt(k);
        }
        Split split = Resampling.groupedStratifiedSplit(labels, groups, k, 0.25, seed).split();
        int[] train = split.train();
        int[] trainLabels = new int[train.length];
        int[] trainGroups = new int[train.length];
        for (int i = 0; i < train.length; i++) {
            trainLabels[i] = labels[train[i]];
            trainGroups[i] = groups[train[i]];
        }
        List<Fold> folds;
        try {
            folds = Resampling.groupedStratifiedKFold(trainLabels, trainGroups, k, 2, 2, seed).folds();
        } catch (TooFewGroupsException e) {
            assertThat(e.groups()).isLessThan(2);
            return;
        }
        int[] assigned = RowAssignments.foldOfRow(n, split, folds);
        Map<Integer, Integer> placeOfGroup = new HashMap<>();
        for (int row = 0; row < n; row++) {
            assertThat(assigned[row]).isBetween(RowAssignments.TEST, 1);
            Integer before = placeOfGroup.putIfAbsent(groups[row], assigned[row]);
            assertThat(before == null ? assigned[row] : before).as("group %d", groups[row]).isEqualTo(assigned[row]);
        }
    }
}
