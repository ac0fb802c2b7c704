package dev.pressmark.core.evaluate;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.node.JsonNodeFactory;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.util.Locale;
import java.util.Objects;

/**
 * The manifest's {@code duplicates} object: how often the rows a run trained and tested on repeat
 * a text. Texts are ids of normalised texts (equal id, identical text); every count is over the
 * rows the run used, after {@code drop} left repeats out.
 *
 * @param setting the {@code data.duplicates} setting used: {@code keep}, {@code group} or {@code drop}
 * @param droppedRows rows that {@code drop} left out (0 with the other settings)
 * @param withinTrain texts on two or more training rows, and the training rows that hold them
 * @param withinTest texts on two or more test rows, and the test rows that hold them
 * @param acrossSplit texts on at least one training row and one test row, and the test rows that
 *     hold them (rows the model may have seen, in effect, before it is tested on them)
 * @param conflictingLabels texts whose rows (training and test) carry more than one label, and
 *     all the rows that hold them
 */
public record DuplicateCounts(String setting, int droppedRows, Tally withinTrain, Tally withinTest, Tally acrossSplit,
                              Tally conflictingLabels) {

    /** The manifest's key for this object. */
    public static final String KEY = "duplicates";

    /**
     * A count of distinct texts and of the rows that hold them.
     *
     * @param texts distinct texts
     * @param rows rows that hold one of them
     */
    public record Tally(int texts, int rows) {
        public Tally {
            if (texts < 0 || rows < texts) {
                throw new IllegalArgumentException("a tally needs 0 <= texts <= rows, was " + texts + " texts and " + rows + " rows");
            }
        }
    }

    public DuplicateCounts {
        Objects.requireNonNull(setting, "setting");
        if (droppedRows < 0) {
            throw new IllegalArgumentException("droppedRows must be >= 0, was " + droppedRows);
        }
        Objects.requireNonNull(withinTrain, "withinTrain");
        Objects.requireNonNull(withinTest, "withinTest");
        Objects.requireNonNull(acrossSplit, "acrossSplit");
        Objects.requireNonNull(conflictingLabels, "conflictingLabels");
    }

    /**
     * Counts the duplicates of a split.
     *
     * @param textIds per row, the id of its normalised text, from 0
     * @param labels per row, its class
     * @param split the rows of each side (rows on neither side are not counted)
     */
    public static DuplicateCounts count(int[] textIds, int[] labels, Split split, String setting, int droppedRows) {
        int texts = 0;
        for (int id : textIds) {
            texts = Math.max(texts, id + 1);
        }
        int[] inTrain = new int[texts];
        int[] inTest = new int[texts];
        for (int row : split.train()) {
            inTrain[textIds[row]]++;
        }
        for (int row : split.test()) {
            inTest[textIds[row]]++;
        }
        int[] firstLabel = new int[texts];
        java.util.Arrays.fill(firstLabel, -1);
        boolean[] conflicting = new boolean[texts];
        conflicts(textIds, labels, split.train(), firstLabel, conflicting);
        conflicts(textIds, labels, split.test(), firstLabel, conflicting);
        Counter train = new Counter();
        Counter test = new Counter();
        Counter across = new Counter();
        Counter conflict = new Counter();
        for (int t = 0; t < texts; t++) {
            train.addIf(inTrain[t] > 1, inTrain[t]);
            test.addIf(inTest[t] > 1, inTest[t]);
            across.addIf(inTrain[t] > 0 && inTest[t] > 0, inTest[t]);
            conflict.addIf(conflicting[t], inTrain[t] + inTest[t]);
        }
        return new DuplicateCounts(setting, droppedRows, train.tally(), test.tally(), across.tally(), conflict.tally());
    }

    /** Texts and rows, counted up. */
    private static final class Counter {
        private int texts;
        private int rows;

        void addIf(boolean counted, int rowsOfText) {
            if (counted) {
                texts++;
                rows += rowsOfText;
            }
        }

        Tally tally() {
            return new Tally(texts, rows);
        }
    }

    private static void conflicts(int[] textIds, int[] labels, int[] rows, int[] firstLabel, boolean[] conflicting) {
        for (int row : rows) {
            int t = textIds[row];
            if (firstLabel[t] < 0) {
                firstLabel[t] = labels[row];
            } else if (firstLabel[t] != labels[row]) {
                conflicting[t] = true;
            }
        }
    }

    /**
     * One line for people: the setting, then each count, for example {@code keep: 3 texts repeated
     * in training (8 rows), 1 in test (2 rows), 2 across the split (3 test rows), 1 with
     * conflicting labels (4 rows)}.
     */
    public String summary() {
        return setting + ": " + (droppedRows > 0 ? count(droppedRows, "row") + " dropped; " : "")
                + count(withinTrain.texts, "text") + " repeated in training (" + count(withinTrain.rows, "row") + "), "
                + count(withinTest.texts, "text") + " in test (" + count(withinTest.rows, "row") + "), "
                + count(acrossSplit.texts, "text") + " across the split (" + count(acrossSplit.rows, "test row") + "), "
                + count(conflictingLabels.texts, "text") + " with conflicting labels (" + count(conflictingLabels.rows, "row") + ")";
    }

    /** {@code 1 text}, {@code 1,024 texts}: the noun in the singular only for one. */
    private static String count(int n, String noun) {
        return String.format(Locale.ROOT, "%,d %s%s", n, noun, n == 1 ? "" : "s");
    }

    /** The object as the manifest holds it. */
    public ObjectNode toJson() {
        ObjectNode node = JsonNodeFactory.instance.objectNode();
        node.put("setting", setting);
        node.put("dropped_rows", droppedRows);
        node.putObject("within_train").put("texts", withinTrain.texts).put("rows", withinTrain.rows);
        node.putObject("within_test").put("texts", withinTest.texts).put("rows", withinTest.rows);
        node.putObject("across_split").put("texts", acrossSplit.texts).put("test_rows", acrossSplit.rows);
        node.putObject("conflicting_labels").put("texts", conflictingLabels.texts).put("rows", conflictingLabels.rows);
        return node;
    }

    /**
     * Reads the object {@link #toJson} writes (the manifest's {@code duplicates} section, which the
     * manifest reader hands over).
     */
    public static DuplicateCounts fromJson(JsonNode node) {
        return new DuplicateCounts(node.path("setting").asText(), node.path("dropped_rows").asInt(),
                tally(node.path("within_train"), "rows"), tally(node.path("within_test"), "rows"),
                tally(node.path("across_split"), "test_rows"), tally(node.path("conflicting_labels"), "rows"));
    }

    private static Tally tally(JsonNode node, String rowsKey) {
        return new Tally(node.path("texts").asInt(), node.path(rowsKey).asInt());
    }
}
