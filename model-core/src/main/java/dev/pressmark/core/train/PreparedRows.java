package dev.pressmark.core.train;

import dev.pressmark.core.evaluate.Split;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.HashSet;
import java.util.List;
import java.util.Map;
import java.util.Set;

/**
 * The rows a run trains and tests on, once {@code data.duplicates} has had its say: each row's
 * normalised text id ({@link TextKeys}), and with {@code drop} the rows left after later repeats
 * of a (text, label) pair were left out. Rows of a separate test file are never left out: that
 * file is the test as given.
 *
 * @param data the rows kept
 * @param fixedSplit the split a test file fixed, over the kept rows, or null
 * @param textIds per kept row, its text id
 * @param droppedRows how many rows {@code drop} left out
 */
record PreparedRows(LabelledData data, Split fixedSplit, int[] textIds, int droppedRows) {

    static PreparedRows of(TrainPlan plan, LabelledData data, Split fixedSplit) {
        List<TrainConfig> configs = new ArrayList<>();
        configs.add(plan.config());
        if (plan.search() != null) {
            configs.addAll(plan.search().configs());
        }
        int[] ids = TextKeys.of(data.texts(), TextKeys.normalizers(configs));
        if (plan.config().data().duplicates() != DuplicatesMode.DROP) {
            return new PreparedRows(data, fixedSplit, ids, 0);
        }
        int eligible = fixedSplit == null ? data.rows() : fixedSplit.train().length;
        int[] kept = firstOfEachPair(ids, data.labels(), eligible);
        int dropped = data.rows() - kept.length;
        if (dropped == 0) {
            return new PreparedRows(data, fixedSplit, ids, 0);
        }
        Split split = null;
        if (fixedSplit != null) {
            int train = eligible - dropped;
            split = new Split(range(0, train), range(train, kept.length));
        }
        return new PreparedRows(data.rowsAt(kept), split, TrainingRun.select(ids, kept), dropped);
    }

    /**
     * The rows to keep: of the first {@code eligible} rows, each first row of its (text, label)
     * pair; every row after them.
     */
    static int[] firstOfEachPair(int[] ids, List<String> labels, int eligible) {
        Map<String, Integer> labelIds = new HashMap<>();
        Set<Long> seen = new HashSet<>(eligible * 2);
        int[] kept = new int[ids.length];
        int n = 0;
        for (int i = 0; i < ids.length; i++) {
            if (i < eligible) {
                Integer label = labelIds.computeIfAbsent(labels.get(i), key -> labelIds.size());
                if (!seen.add(((long) ids[i] << 32) | label)) {
                    continue;
                }
            }
            kept[n++] = i;
        }
        return java.util.Arrays.copyOf(kept, n);
    }

    private static int[] range(int from, int to) {
        int[] out = new int[to - from];
        for (int i = 0; i < out.length; i++) {
            out[i] = from + i;
        }
        return out;
    }
}
