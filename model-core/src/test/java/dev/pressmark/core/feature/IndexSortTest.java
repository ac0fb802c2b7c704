package dev.pressmark.core.feature;

import static org.assertj.core.api.Assertions.assertThat;

import java.util.Arrays;
import java.util.SplittableRandom;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.constraints.IntRange;

/** The radix sort of a row's feature indices orders them as the JDK's {@link Arrays#sort(int[], int, int)} (the reference) does. */
class IndexSortTest {

    @Property(tries = 400)
    void sorts_distinct_indices_as_the_jdk_sort_does(@ForAll @IntRange(min = 1, max = 1 << 26) int featureCount,
            @ForAll @IntRange(min = 0, max = 600) int wanted, @ForAll long seed) {
        SplittableRandom random = new SplittableRandom(seed);
        int length = Math.min(wanted, featureCount);
        // distinct indices, as a row's features are: a random sample of [0, featureCount)
        int[] row = random.ints(0, featureCount).distinct().limit(length).toArray();
        int[] expected = row.clone();
        Arrays.sort(expected);
        int[] actual = Arrays.copyOf(row, row.length + 3);
        new IndexSort(featureCount).sort(actual, length);
        assertThat(Arrays.copyOf(actual, length)).containsExactly(expected);
    }

    @Property(tries = 50)
    void one_sorter_sorts_row_after_row(@ForAll long seed) {
        SplittableRandom random = new SplittableRandom(seed);
        IndexSort sort = new IndexSort(70_000);
        for (int r = 0; r < 20; r++) {
            int[] row = random.ints(0, 70_000).distinct().limit(random.nextInt(IndexSort.RADIX_FROM + 200)).toArray();
            int[] expected = row.clone();
            Arrays.sort(expected);
            sort.sort(row, row.length);
            assertThat(row).containsExactly(expected);
        }
    }
}
