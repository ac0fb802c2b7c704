package dev.pressmark.spark;

import dev.pressmark.core.bundle.Bundle;
import dev.pressmark.core.bundle.ScoredRows;
import java.util.ArrayList;
import java.util.Iterator;
import java.util.List;
import java.util.NoSuchElementException;
import org.apache.spark.TaskContext;
import org.apache.spark.api.java.function.MapPartitionsFunction;
import org.apache.spark.broadcast.Broadcast;
import org.apache.spark.sql.Row;

/**
 * Scores a partition a batch of rows at a time with {@link Bundle#score}, the batch path of
 * {@code pressmark predict --data}: one call per {@value #BATCH_ROWS} rows instead of a one-item
 * {@code Bundle.predict} per row, no map of texts, {@code Prediction} or feature matrix per row.
 * Each output row is the input row's values followed by the prediction as its {@link ScoredLayout}
 * lays it out (the {@link PredictionColumn#TYPE} struct, or flat columns for CSV): the same numbers
 * as {@link PredictFunction} gives (Bundle.score and Bundle.predict decide in one place). A row
 * with a null text gets a null prediction, as the SQL function gives it.
 */
final class PartitionScorer implements MapPartitionsFunction<Row, Row> {

    /** Rows scored per call: enough that the call's fixed cost vanishes, few enough to stay in cache. */
    static final int BATCH_ROWS = 1024;

    private static final long serialVersionUID = 1L;

    private final Broadcast<byte[]> bytes;
    private final String sha256;
    private final ScoredLayout layout;
    /** Per input field of the bundle, in its order, the index of the column that holds its text. */
    private final int[] inputColumns;
    private final int maxTokensPerField;

    PartitionScorer(Broadcast<byte[]> bytes, String sha256, ScoredLayout layout, int[] inputColumns, int maxTokensPerField) {
        this.bytes = bytes;
        this.sha256 = sha256;
        this.layout = layout;
        this.inputColumns = inputColumns.clone();
        this.maxTokensPerField = maxTokensPerField;
    }

    @Override
    public Iterator<Row> call(Iterator<Row> rows) {
        TaskContext task = TaskContext.get();
        boolean firstPartition = task == null || task.partitionId() == 0;
        return new Batches(BundleCache.get(sha256, bytes::value), rows, firstPartition);
    }

    /** The scored rows of one partition, read and scored a batch at a time as they are asked for. */
    private final class Batches implements Iterator<Row> {

        private final Bundle bundle;
        private final Iterator<Row> input;
        private final ScoredRows scored;
        private final List<Row> batch = new ArrayList<>(BATCH_ROWS);
        /** Per row of {@link #batch}, its index among the rows scored, or -1 for a row with a null text. */
        private final int[] scoredIndex = new int[BATCH_ROWS];
        private final List<String[]> texts = new ArrayList<>(BATCH_ROWS);
        private int next;
        /**
         * The layout's header row until it has been given out: before a partition's first row, and
         * in the first partition even when it has none, so that a table without rows still gets a
         * file with its header, as Spark's CSV writer writes one.
         */
        private Row header;
        private final boolean headerEvenIfEmpty;

        Batches(Bundle bundle, Iterator<Row> input, boolean firstPartition) {
            this.bundle = bundle;
            this.input = input;
            this.scored = new ScoredRows(BATCH_ROWS, bundle.labels().size(), bundle.hasProbabilities());
            this.header = layout.header();
            this.headerEvenIfEmpty = firstPartition;
        }

        @Override
        public boolean hasNext() {
            if (next < batch.size() || headerDue()) {
                return true;
            }
            return input.hasNext();
        }

        private boolean headerDue() {
            return header != null && (headerEvenIfEmpty || input.hasNext());
        }

        @Override
        public Row next() {
            if (headerDue()) {
                Row first = header;
                header = null;
                return first;
            }
            if (next == batch.size()) {
                if (!input.hasNext()) {
                    throw new NoSuchElementException("no rows left in this partition");
                }
                readAndScore();
            }
            Row row = batch.get(next);
            return layout.row(row, scored, scoredIndex[next++]);
        }

        private void readAndScore() {
            batch.clear();
            texts.clear();
            next = 0;
            while (batch.size() < BATCH_ROWS && input.hasNext()) {
                Row row = input.next();
                scoredIndex[batch.size()] = textsOf(row);
                batch.add(row);
            }
            if (!texts.isEmpty()) {
                bundle.score(texts, maxTokensPerField, scored);
            }
        }

        /** Adds {@code row}'s texts to {@link #texts} and returns their index there, or -1 when one is null. */
        private int textsOf(Row row) {
            String[] text = new String[inputColumns.length];
            for (int f = 0; f < text.length; f++) {
                text[f] = row.getString(inputColumns[f]);
                if (text[f] == null) {
                    return -1;
                }
            }
            texts.add(text);
            return texts.size() - 1;
        }
    }
}
