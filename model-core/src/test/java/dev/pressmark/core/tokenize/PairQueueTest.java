package dev.pressmark.core.tokenize;

import static org.assertj.core.api.Assertions.assertThat;

import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.constraints.IntRange;
import net.jqwik.api.constraints.Size;

class PairQueueTest {

    record Entry(int pair, int version, double score, long count) {
    }

    /** The queue's documented order, written with java.util.Comparator as the reference. */
    private static final Comparator<Entry> ORDER = Comparator.comparingDouble(Entry::score).reversed()
            .thenComparing(Comparator.comparingLong(Entry::count).reversed())
            .thenComparingInt(Entry::pair);

    private static List<Entry> entries(List<Integer> seeds) {
        List<Entry> entries = new ArrayList<>();
        for (int i = 0; i < seeds.size(); i++) {
            int seed = seeds.get(i);
            // Few distinct scores and counts, so that the tie order decides often.
            entries.add(new Entry(i, seed % 3, 1.0 / (1 + seed % 4), 1 + seed % 5));
        }
        return entries;
    }

    private static List<Entry> drain(PairQueue queue, List<Entry> entries) {
        List<Entry> out = new ArrayList<>();
        while (!queue.isEmpty()) {
            out.add(entries.get(queue.topPair()));
            assertThat(queue.topVersion()).isEqualTo(entries.get(queue.topPair()).version());
            queue.pop();
        }
        return out;
    }

    @Property(tries = 200)
    void pops_in_the_order_a_full_sort_gives(@ForAll @Size(max = 300) List<@IntRange(min = 0, max = 1000) Integer> seeds) {
        List<Entry> entries = entries(seeds);
        PairQueue pushed = new PairQueue(1, Integer::compare);
        PairQueue heapified = new PairQueue(1, Integer::compare);
        for (Entry e : entries) {
            pushed.push(e.pair(), e.version(), e.score(), e.count());
            heapified.append(e.pair(), e.version(), e.score(), e.count());
        }
        heapified.heapify();
        List<Entry> sorted = new ArrayList<>(entries);
        sorted.sort(ORDER);

        assertThat(drain(pushed, entries)).isEqualTo(sorted);
        assertThat(drain(heapified, entries)).isEqualTo(sorted);
    }

    @Property(tries = 100)
    void holds_only_what_is_added_after_a_clear(
            @ForAll @Size(max = 300) List<@IntRange(min = 0, max = 1000) Integer> seeds) {
        List<Entry> entries = entries(seeds);
        PairQueue queue = new PairQueue(1, Integer::compare);
        for (Entry e : entries) {
            queue.push(e.pair(), e.version(), e.score(), e.count());
        }
        queue.clear();
        assertThat(queue.isEmpty()).isTrue();
        List<Entry> kept = new ArrayList<>();
        for (int i = 0; i < entries.size(); i += 2) {
            Entry e = entries.get(i);
            queue.append(e.pair(), e.version(), e.score(), e.count());
            kept.add(e);
        }
        queue.heapify();
        kept.sort(ORDER);

        assertThat(drain(queue, entries)).isEqualTo(kept);
    }

    @Property(tries = 200)
    void keeps_only_live_entries_in_order_after_a_rebuild(
            @ForAll @Size(max = 300) List<@IntRange(min = 0, max = 1000) Integer> seeds) {
        List<Entry> entries = entries(seeds);
        PairQueue queue = new PairQueue(1, Integer::compare);
        for (Entry e : entries) {
            queue.push(e.pair(), e.version(), e.score(), e.count());
        }
        queue.retain((pair, version) -> version != 0);
        List<Entry> expected = new ArrayList<>();
        for (Entry e : entries) {
            if (e.version() != 0) {
                expected.add(e);
            }
        }
        expected.sort(ORDER);

        assertThat(queue.size()).isEqualTo(expected.size());
        assertThat(drain(queue, entries)).isEqualTo(expected);
    }
}
