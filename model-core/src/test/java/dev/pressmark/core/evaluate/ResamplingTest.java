package dev.pressmark.core.evaluate;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import dev.pressmark.core.PressmarkException;
import java.util.List;
import java.util.SplittableRandom;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.constraints.DoubleRange;
import net.jqwik.api.constraints.IntRange;
import org.junit.jupiter.api.Test;

class ResamplingTest {

    /** Labels with class sizes drawn at random, every class at least {@code minRows} rows. */
    private static int[] labels(SplittableRandom random, int classCount, int minRows, int maxRows) {
        int[] sizes = new int[classCount];
        int n = 0;
        for (int k = 0; k < classCount; k++) {
            sizes[k] = minRows + random.nextInt(maxRows - minRows + 1);
            n += sizes[k];
        }
        int[] labels = new int[n];
        int row = 0;
        for (int k = 0; k < classCount; k++) {
            for (int i = 0; i < sizes[k]; i++) {
                labels[row++] = k;
            }
        }
        Fixtures.shuffle(labels, random);
        return labels;
    }

    private static int[] countsOf(int[] labels, int[] rows, int classCount) {
        int[] counts = new int[classCount];
        for (int row : rows) {
            counts[labels[row]]++;
        }
        return counts;
    }

    private static int[] allRows(int n) {
        int[] rows = new int[n];
        for (int i = 0; i < n; i++) {
            rows[i] = i;
        }
        return rows;
    }

    private static void assertStrictlyIncreasing(int[] rows) {
        for (int i = 1; i < rows.length; i++) {
            assertThat(rows[i]).isGreaterThan(rows[i - 1]);
        }
    }

    // ---- split ----------------------------------------------------------------------------

    @Test
    void split_holds_out_the_rounded_share_of_each_class() {
        // Class sizes 10, 4, 1, 2 at a quarter: 2.5 rounds up to 3; 1.0 is 1; a single row stays in
        // training; 0.5 rounds up to 1, which leaves the class's other row in training.
        int[] labels = new int[17];
        int row = 0;
        int[] sizes = {10, 4, 1, 2};
        for (int k = 0; k < sizes.length; k++) {
            for (int i = 0; i < sizes[k]; i++) {
                labels[row++] = k;
            }
        }
        Split split = Resampling.stratifiedSplit(labels, 4, 0.25, 7);
        assertThat(countsOf(labels, split.test(), 4)).containsExactly(3, 1, 0, 1);
        assertThat(countsOf(labels, split.train(), 4)).containsExactly(7, 3, 1, 1);
    }

    @Test
    void split_keeps_one_training_row_even_when_the_fraction_would_take_all() {
        int[] labels = {0, 0, 1, 1, 1, 1};
        Split split = Resampling.stratifiedSplit(labels, 2, 0.9, 1);
        assertThat(countsOf(labels, split.train(), 2)).containsExactly(1, 1);
        assertThat(countsOf(labels, split.test(), 2)).containsExactly(1, 3);
    }

    @Property(tries = 300)
    void a_split_partitions_the_rows_by_the_documented_counts(@ForAll long seed,
            @ForAll @IntRange(min = 1, max = 6) int classCount, @ForAll @DoubleRange(min = 0.01, max = 0.99) double fraction) {
        SplittableRandom random = new SplittableRandom(seed);
        int[] labels = labels(random, classCount, 1, 40);
        Split split = Resampling.stratifiedSplit(labels, classCount, fraction, seed);
        int[] train = split.train();
        int[] test = split.test();
        assertStrictlyIncreasing(train);
        assertStrictlyIncreasing(test);
        assertThat(train.length + test.length).isEqualTo(labels.length);
        boolean[] seen = new boolean[labels.length];
        for (int r : train) {
            seen[r] = true;
        }
        for (int r : test) {
            assertThat(seen[r]).as("row %d on both sides", r).isFalse();
            seen[r] = true;
        }
        int[] all = countsOf(labels, allRows(labels.length), classCount);
        int[] held = countsOf(labels, test, classCount);
        int[] kept = countsOf(labels, train, classCount);
        for (int k = 0; k < classCount; k++) {
            // Round half up, then leave at least one row in training.
            long expected = all[k] < 2 ? 0 : Math.min((long) Math.floor(fraction * all[k] + 0.5), all[k] - 1);
            assertThat(held[k]).as("test rows of class %d of %d", k, all[k]).isEqualTo((int) expected);
            assertThat(kept[k]).isGreaterThanOrEqualTo(1);
        }
    }

    @Property(tries = 100)
    void the_same_seed_gives_the_same_split(@ForAll long seed) {
        int[] labels = labels(new SplittableRandom(seed), 3, 2, 30);
        assertThat(Resampling.stratifiedSplit(labels, 3, 0.3, seed))
                .isEqualTo(Resampling.stratifiedSplit(labels, 3, 0.3, seed));
    }

    @Property(tries = 100)
    void a_different_seed_gives_a_different_split(@ForAll long seed) {
        // 60 rows per class, 18 held out: two seeds agree on a class with probability 1 / C(60, 18).
        int[] labels = labels(new SplittableRandom(seed), 2, 60, 60);
        assertThat(Resampling.stratifiedSplit(labels, 2, 0.3, seed))
                .isNotEqualTo(Resampling.stratifiedSplit(labels, 2, 0.3, seed + 1));
    }

    @Test
    void split_rejects_a_fraction_outside_the_open_unit_interval() {
        assertThatThrownBy(() -> Resampling.stratifiedSplit(new int[] {0, 1}, 2, 1.0, 1))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessage("testFraction must be in (0, 1), was 1.0");
        assertThatThrownBy(() -> Resampling.stratifiedSplit(new int[] {0, 1}, 2, Double.NaN, 1))
                .isInstanceOf(IllegalArgumentException.class);
    }

    @Test
    void rejects_a_label_outside_the_class_range_naming_its_row() {
        assertThatThrownBy(() -> Resampling.stratifiedSplit(new int[] {0, 1, 2}, 2, 0.5, 1))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessage("labels[2] must be in [0, 2), was 2");
    }

    // ---- k-fold ---------------------------------------------------------------------------

    @Property(tries = 200)
    void each_fold_holds_each_class_within_one_row_of_its_share(@ForAll long seed,
            @ForAll @IntRange(min = 1, max = 5) int classCount, @ForAll @IntRange(min = 2, max = 10) int folds,
            @ForAll @IntRange(min = 1, max = 3) int repeats) {
        SplittableRandom random = new SplittableRandom(seed);
        int[] labels = labels(random, classCount, folds, 45);
        int[] all = countsOf(labels, allRows(labels.length), classCount);
        for (Fold fold : Resampling.stratifiedKFold(labels, classCount, folds, repeats, seed)) {
            int[] held = countsOf(labels, fold.test(), classCount);
            for (int k = 0; k < classCount; k++) {
                double share = (double) all[k] / folds;
                assertThat(Math.abs(held[k] - share)).as("class %d in %s", k, fold).isLessThan(1.0);
            }
            assertThat(Math.abs(fold.testSize() - (double) labels.length / folds)).isLessThan(1.0);
        }
    }

    @Property(tries = 200)
    void the_folds_of_each_repeat_partition_the_rows_and_train_is_the_rest(@ForAll long seed,
            @ForAll @IntRange(min = 1, max = 4) int classCount, @ForAll @IntRange(min = 2, max = 8) int folds,
            @ForAll @IntRange(min = 1, max = 3) int repeats) {
        int[] labels = labels(new SplittableRandom(seed), classCount, folds, 30);
        List<Fold> all = Resampling.stratifiedKFold(labels, classCount, folds, repeats, seed);
        assertThat(all).hasSize(folds * repeats);
        for (int r = 0; r < repeats; r++) {
            int[] timesHeld = new int[labels.length];
            for (int f = 0; f < folds; f++) {
                Fold fold = all.get(r * folds + f);
                assertThat(fold.repeat()).isEqualTo(r);
                assertThat(fold.index()).isEqualTo(f);
                assertStrictlyIncreasing(fold.train());
                assertStrictlyIncreasing(fold.test());
                boolean[] inTest = new boolean[labels.length];
                for (int row : fold.test()) {
                    inTest[row] = true;
                    timesHeld[row]++;
                }
                for (int row : fold.train()) {
                    assertThat(inTest[row]).as("row %d in train and test of %s", row, fold).isFalse();
                }
                assertThat(fold.trainSize() + fold.testSize()).isEqualTo(labels.length);
            }
            for (int row = 0; row < labels.length; row++) {
                assertThat(timesHeld[row]).as("row %d held out in repeat %d", row, r).isEqualTo(1);
            }
        }
    }

    @Property(tries = 100)
    void the_same_seed_gives_the_same_folds(@ForAll long seed, @ForAll @IntRange(min = 2, max = 6) int folds) {
        int[] labels = labels(new SplittableRandom(seed), 3, folds, 25);
        assertThat(Resampling.stratifiedKFold(labels, 3, folds, 2, seed))
                .isEqualTo(Resampling.stratifiedKFold(labels, 3, folds, 2, seed));
    }

    @Property(tries = 100)
    void a_different_seed_gives_different_folds(@ForAll long seed) {
        // 3 classes of 40 rows in 5 folds: identical assignments by chance are vanishingly rare.
        int[] labels = labels(new SplittableRandom(seed), 3, 40, 40);
        assertThat(Resampling.stratifiedKFold(labels, 3, 5, 1, seed))
                .isNotEqualTo(Resampling.stratifiedKFold(labels, 3, 5, 1, seed ^ 0x5DEECE66DL));
    }

    @Property(tries = 50)
    void each_repeat_reshuffles_and_earlier_repeats_do_not_depend_on_later_ones(@ForAll long seed) {
        int[] labels = labels(new SplittableRandom(seed), 2, 30, 30);
        List<Fold> three = Resampling.stratifiedKFold(labels, 2, 4, 3, seed);
        List<Fold> one = Resampling.stratifiedKFold(labels, 2, 4, 1, seed);
        assertThat(three.subList(0, 4)).isEqualTo(one);
        for (int f = 0; f < 4; f++) {
            assertThat(three.get(4 + f).test()).isNotEqualTo(three.get(f).test());
        }
    }

    @Test
    void more_folds_than_rows_in_the_smallest_class_is_an_error_naming_the_class() {
        int[] labels = new int[34];
        for (int i = 0; i < labels.length; i++) {
            labels[i] = i < 15 ? 0 : i < 30 ? 1 : 2;
        }
        assertThatThrownBy(() -> Resampling.stratifiedKFold(labels, 3, 10, 1, 1))
                .isInstanceOf(PressmarkException.class)
                .hasMessage("fold count 10 exceeds the 4 rows of class 2")
                .extracting(e -> ((PressmarkException) e).code())
                .isEqualTo("fold-count-exceeds-class-size");
    }

    @Test
    void a_class_with_no_rows_takes_no_part_in_the_folds() {
        int[] labels = {0, 0, 2, 2, 0, 2};
        List<Fold> folds = Resampling.stratifiedKFold(labels, 3, 3, 1, 5);
        for (Fold fold : folds) {
            assertThat(countsOf(labels, fold.test(), 3)).containsExactly(1, 0, 1);
        }
    }

    @Test
    void fewer_than_two_folds_or_no_repeats_are_rejected() {
        int[] labels = {0, 0, 1, 1};
        assertThatThrownBy(() -> Resampling.stratifiedKFold(labels, 2, 1, 1, 1))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessage("folds must be >= 2, was 1");
        assertThatThrownBy(() -> Resampling.stratifiedKFold(labels, 2, 2, 0, 1))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessage("repeats must be >= 1, was 0");
    }

    @Test
    void a_fold_refuses_overlapping_sides() {
        assertThatThrownBy(() -> new Fold(0, 0, new int[] {0, 2}, new int[] {1, 2}))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessage("train and test must be disjoint, both hold row 2");
        assertThatThrownBy(() -> new Split(new int[] {3, 1}, new int[] {0}))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessage("train must be strictly increasing row indices >= 0, but train[1] was 1 after 3");
    }

    @Test
    void a_split_hands_out_copies_of_its_rows() {
        Split split = new Split(new int[] {0, 2}, new int[] {1});
        split.train()[0] = 7;
        assertThat(split.train()).containsExactly(0, 2);
    }
}
