package dev.pressmark.core.feature;

import static org.assertj.core.api.Assertions.assertThat;

import java.util.Arrays;
import java.util.SplittableRandom;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.constraints.IntRange;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

/** The sort of a row's feature indices orders them as the JDK's {@link Arrays#sort(int[], int, int)} (the reference) does. */
class IndexSortTest {

    @Property(tries = 400)
    void sorts_distinct_indices_as_the_jdk_sort_does(@ForAll @IntRange(min = 1, max = 1 << 26) int featureCount,
            @ForAll @IntRange(min = 0, max = 600) int wanted, @ForAll long seed) {
        int length = Math.min(wanted, featureCount);
        assertSortsLikeTheJdk(new IndexSort(featureCount), sample(featureCount, length, new SplittableRandom(seed)));
    }

    @Property(tries = 400)
    void the_bitset_sorts_random_subsets_as_the_jdk_sort_does(@ForAll @IntRange(min = 1, max = 300_000) int featureCount,
            @ForAll @IntRange(min = 0, max = 2_000) int wanted, @ForAll long seed) {
        // at least as long as the summary (featureCount / 4096 words), which is what sends a row to the bitset
        int length = Math.min(featureCount, Math.max(wanted, (featureCount + 4095) / 4096));
        IndexSort sort = new IndexSort(featureCount);
        assertThat(sort.usesBitset(length)).isTrue();
        assertSortsLikeTheJdk(sort, sample(featureCount, length, new SplittableRandom(seed)));
    }

    @ParameterizedTest
    @ValueSource(ints = {1, 2, 63, 64, 65, 4_095, 4_096, 4_097, 262_143, 262_144, 262_145})
    void the_bitset_sorts_every_index_of_the_space_and_the_first_and_last(int featureCount) {
        SplittableRandom random = new SplittableRandom(featureCount);
        int[] all = sample(featureCount, featureCount, random);
        IndexSort sort = new IndexSort(featureCount);
        assertThat(sort.usesBitset(all.length)).isTrue();
        assertSortsLikeTheJdk(sort, all);
        int[] ends = featureCount == 1 ? new int[] {0} : new int[] {featureCount - 1, 0};
        // a row as short as the summary still goes through the bitset when the space is small
        if (sort.usesBitset(ends.length)) {
            assertSortsLikeTheJdk(sort, ends);
        }
    }

    @Property(tries = 50)
    void one_sorter_sorts_row_after_row(@ForAll long seed) {
        SplittableRandom random = new SplittableRandom(seed);
        IndexSort sort = new IndexSort(70_000);
        for (int r = 0; r < 20; r++) {
            assertSortsLikeTheJdk(sort, sample(70_000, random.nextInt(IndexSort.RADIX_FROM + 200), random));
        }
    }

    @Property(tries = 50)
    void one_sorter_switches_between_its_ways_row_after_row_with_nothing_left_over(@ForAll long seed) {
        SplittableRandom random = new SplittableRandom(seed);
        // 200,000 features: a summary of 49 words, so rows of 0 to 48 go to Arrays.sort, longer ones to the bitset
        IndexSort sort = new IndexSort(200_000);
        for (int r = 0; r < 40; r++) {
            assertSortsLikeTheJdk(sort, sample(200_000, random.nextInt(300), random));
        }
        IndexSort large = new IndexSort(1 << 24);
        for (int r = 0; r < 20; r++) {
            assertSortsLikeTheJdk(large, sample(1 << 24, random.nextInt(5_000), random));
        }
    }

    /** Distinct indices, as a row's features are: a random sample of {@code [0, featureCount)} in random order. */
    private static int[] sample(int featureCount, int length, SplittableRandom random) {
        if (2 * length > featureCount) {
            int[] all = new int[featureCount];
            for (int j = 0; j < featureCount; j++) {
                all[j] = j;
            }
            for (int j = featureCount - 1; j > 0; j--) {
                int k = random.nextInt(j + 1);
                int t = all[j];
                all[j] = all[k];
                all[k] = t;
            }
            return Arrays.copyOf(all, length);
        }
        return random.ints(0, featureCount).distinct().limit(length).toArray();
    }

    private static void assertSortsLikeTheJdk(IndexSort sort, int[] row) {
        int[] expected = row.clone();
        Arrays.sort(expected);
        int[] actual = Arrays.copyOf(row, row.length + 3);
        actual[row.length] = -7;
        sort.sort(actual, row.length);
        assertThat(Arrays.copyOf(actual, row.length)).isEqualTo(expected);
        assertThat(actual[row.length]).as("the entry after the row").isEqualTo(-7);
    }
}
