package dev.pressmark.core.feature;

import dev.pressmark.core.PressmarkException;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.HashMap;
import java.util.HashSet;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.function.Function;

/** Fits a {@link FeatureSpace}: counts document frequencies, selects, then fits idf and moments. */
final class FeatureFitter {

    private FeatureFitter() {
    }

    static FeatureSpace fit(FeatureConfig config, List<String> columns, List<List<List<String>>> rows, ViewCaps caps) {
        Objects.requireNonNull(config, "config");
        Objects.requireNonNull(caps, "caps");
        checkColumns(columns);
        Objects.requireNonNull(rows, "rows");
        if (rows.isEmpty()) {
            throw new PressmarkException("empty-training-set", "there are no training rows to fit the features on");
        }
        Counts counts = Counts.of(columns, rows, caps);
        return build(config, columns, rows.size(), counts, caps.caps(), unscaled -> unscaled.transform(rows));
    }

    /**
     * Fits from rows that views scan one field at a time; gives exactly the space that the token
     * lists of the same rows, each token prefixed with its view's prefix, would give.
     *
     * @param prefixes per view, what its tokens are prefixed with in the space ({@code ""} for one view)
     * @param caps per view, the most features it may keep
     */
    static FeatureSpace fit(FeatureConfig config, List<String> columns, TokenSource source, List<String> prefixes,
            int[] caps) {
        Objects.requireNonNull(config, "config");
        checkColumns(columns);
        if (source.rows() == 0) {
            throw new PressmarkException("empty-training-set", "there are no training rows to fit the features on");
        }
        if (caps.length != prefixes.size()) {
            throw new IllegalArgumentException("one cap per view: " + caps.length + " caps for " + prefixes.size() + " views");
        }
        Counts counts = Counts.of(columns.size(), source, prefixes);
        return build(config, columns, source.rows(), counts, caps, unscaled -> unscaled.transform(source, prefixes));
    }

    private static FeatureSpace build(FeatureConfig config, List<String> columns, int n, Counts counts, int[] caps,
            Function<FeatureSpace, SparseMatrix> transform) {
        if (counts.distinct == 0) {
            throw new PressmarkException("no-tokens", "the " + n
                    + " training rows hold no tokens in columns " + String.join(", ", columns));
        }
        int[] selected = select(counts, columns, config, caps);
        if (selected.length == 0) {
            throw new PressmarkException("no-features", "no token occurs in at least features.min_df = " + config.minDf()
                    + " of the " + n + " training rows; lower features.min_df");
        }
        int m = selected.length;
        int[] featureColumn = new int[m];
        String[] tokens = new String[m];
        int[] documentFrequency = new int[m];
        for (int j = 0; j < m; j++) {
            int id = selected[j];
            featureColumn[j] = counts.column[id];
            tokens[j] = counts.tokens.get(id);
            documentFrequency[j] = counts.documentFrequency[id];
        }
        double[] idf = null;
        if (config.weighting() == Weighting.TFIDF) {
            idf = new double[m];
            for (int j = 0; j < m; j++) {
                idf[j] = FeatureKernels.smoothIdf(documentFrequency[j], n);
            }
        }
        if (config.scaling() != Scaling.STANDARDIZE) {
            return new FeatureSpace(columns, config, n, featureColumn, tokens, documentFrequency, idf, null, null);
        }
        FeatureSpace unscaled = new FeatureSpace(columns, config.withScaling(Scaling.NONE), n,
                featureColumn, tokens, documentFrequency, idf, null, null);
        double[] means = new double[m];
        double[] standardDeviations = new double[m];
        FeatureKernels.columnMoments(transform.apply(unscaled), means, standardDeviations);
        return new FeatureSpace(columns, config, n, featureColumn, tokens, documentFrequency, idf, means,
                standardDeviations);
    }

    static void checkColumns(List<String> columns) {
        Objects.requireNonNull(columns, "columns");
        if (columns.isEmpty()) {
            throw new IllegalArgumentException("columns must name at least one text column, was empty");
        }
        HashSet<String> seen = new HashSet<>();
        for (int c = 0; c < columns.size(); c++) {
            String column = columns.get(c);
            if (column == null || column.isEmpty()) {
                throw new IllegalArgumentException("columns[" + c + "] must be a non-empty name, was "
                        + (column == null ? "null" : "empty"));
            }
            if (!seen.add(column)) {
                throw new IllegalArgumentException("columns must be distinct, but " + column + " appears twice");
            }
        }
    }

    /**
     * The ids of the features: by descending document frequency, ties to the smaller name, every
     * token seen in at least {@code min_df} rows, until its view has its own cap or all views
     * together have {@code max_tokens}.
     */
    private static int[] select(Counts counts, List<String> columns, FeatureConfig config, int[] caps) {
        int[] df = counts.documentFrequency;
        int frequent = 0;
        for (int id = 0; id < counts.distinct; id++) {
            frequent += df[id] >= config.minDf() ? 1 : 0;
        }
        // Only the tokens that min_df keeps are named and sorted: the rest are most of a large space.
        Integer[] order = new Integer[frequent];
        String[] names = new String[counts.distinct];
        for (int id = 0, k = 0; id < counts.distinct; id++) {
            if (df[id] >= config.minDf()) {
                names[id] = FeatureSpace.name(columns.get(counts.column[id]), counts.tokens.get(id));
                order[k++] = id;
            }
        }
        Arrays.sort(order, (a, b) -> df[a] != df[b] ? Integer.compare(df[b], df[a]) : names[a].compareTo(names[b]));
        int[] room = caps.clone();
        int[] selected = new int[Math.min(config.maxTokens(), frequent)];
        int m = 0;
        for (int k = 0; k < frequent && m < selected.length; k++) {
            int id = order[k];
            int view = counts.view[id];
            if (room[view] > 0) {
                room[view]--;
                selected[m++] = id;
            }
        }
        return Arrays.copyOf(selected, m);
    }

    /** Every distinct (column, token) of the training rows with its document frequency. */
    static final class Counts {

        private int distinct;
        private int[] column = new int[64];
        private int[] view = new int[64];
        private int[] documentFrequency = new int[64];
        /** The last row that counted each id, so that a row counts a token once. */
        private int[] lastRow = new int[64];
        private final List<String> tokens = new ArrayList<>();

        static Counts of(List<String> columns, List<List<List<String>>> rows, ViewCaps caps) {
            Counts counts = new Counts();
            List<Map<String, Integer>> ids = new ArrayList<>(columns.size());
            for (int c = 0; c < columns.size(); c++) {
                ids.add(new HashMap<>());
            }
            for (int i = 0; i < rows.size(); i++) {
                List<List<String>> row = rows.get(i);
                FeatureSpace.checkRow(i, row, columns);
                for (int c = 0; c < columns.size(); c++) {
                    Map<String, Integer> columnIds = ids.get(c);
                    int position = 0;
                    for (String token : row.get(c)) {
                        if (token == null) {
                            throw FeatureSpace.nullToken(i, columns.get(c), position);
                        }
                        Integer id = columnIds.get(token);
                        if (id == null) {
                            id = counts.add(c, caps.viewOf().applyAsInt(token), token);
                            columnIds.put(token, id);
                        }
                        counts.count(id, i);
                        position++;
                    }
                }
            }
            return counts;
        }

        /** Counts the tokens of every field of every row of {@code source}, view by view. */
        static Counts of(int columns, TokenSource source, List<String> prefixes) {
            Counts counts = new Counts();
            SpanCounter[][] ids = new SpanCounter[columns][prefixes.size()];
            for (int c = 0; c < columns; c++) {
                for (int v = 0; v < prefixes.size(); v++) {
                    ids[c][v] = new SpanCounter(prefixes.get(v));
                }
            }
            int[] current = new int[2];
            TokenSource.Sink sink = (v, chars, start, end) ->
                    counts.count(ids[current[1]][v].id(chars, start, end, counts, current[1], v), current[0]);
            for (int i = 0; i < source.rows(); i++) {
                current[0] = i;
                for (int c = 0; c < columns; c++) {
                    current[1] = c;
                    source.scan(i, c, sink);
                }
            }
            return counts;
        }

        int add(int c, int v, String token) {
            if (distinct == column.length) {
                int capacity = distinct * 2;
                view = Arrays.copyOf(view, capacity);
                column = Arrays.copyOf(column, capacity);
                documentFrequency = Arrays.copyOf(documentFrequency, capacity);
                lastRow = Arrays.copyOf(lastRow, capacity);
            }
            column[distinct] = c;
            view[distinct] = v;
            lastRow[distinct] = -1;
            tokens.add(token);
            return distinct++;
        }

        private void count(int id, int row) {
            if (lastRow[id] != row) {
                lastRow[id] = row;
                documentFrequency[id]++;
            }
        }
    }
}
