package dev.pressmark.core.feature;

import com.fasterxml.jackson.annotation.JsonInclude;
import com.fasterxml.jackson.annotation.JsonProperty;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.Collections;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;

/**
 * The fitted, immutable map from token lists to feature rows: which tokens are features, how their
 * occurrences are weighted and how the rows are scaled. {@link #fit} reads the training rows only,
 * so a cross-validation fold refits on its own training part and nothing of its held-out rows
 * leaks into the vocabulary, the idf or the scaling.
 *
 * <h2>Rows and features</h2>
 * A row holds one token list per text column, in the order of {@link #columns()}. A feature is a
 * token in one column, named {@code column:token} ({@code title:##line}); the same token in two
 * columns makes two features. Tokens that are not features are skipped (but count towards a row's
 * length under {@link Weighting#TF} and {@link Weighting#TFIDF}).
 *
 * <h2>Selection and order</h2>
 * The document frequency {@code df} of a feature is the number of training rows whose column holds
 * the token at least once. It is counted per column; then the {@code max_tokens} features of
 * largest {@code df} are selected over all columns together, so a column with many frequent tokens
 * takes more of the budget. Ties go to the smaller feature name in {@link String#compareTo} order.
 * Features are indexed {@code 0 .. m-1} in that same order, by descending {@code df} and then by
 * name, so the selection and the index depend on the training rows as a multiset, not on their
 * order.
 *
 * <h2>Standardisation and the bias</h2>
 * Standardising would map a weighted value {@code x_j} to {@code z_j = (x_j - μ_j) / σ_j}.
 * Subtracting {@code μ} would give every row {@code m} non-zeros, so {@link Scaling#STANDARDIZE}
 * only multiplies: a row holds {@code s_j · x_j} with {@link #scales()} {@code s_j = 1 / σ_j}, and
 * the classifier trains on these sparse rows with its own bias feature. A model
 * {@code f(x) = w · (s ∘ x) + b} trained so is, exactly and for every row,
 * {@code f = w · z + b'} with {@code b' = b + Σ_j w_j s_j μ_j} ({@link #centredIntercept}): the
 * weights {@code w} are already the coefficients on standardised features, and {@code b'} is the
 * decision value of the mean training row, the baseline an explanation starts from.
 *
 * <p>That model is not the one training on the centred {@code z} would have found. The solvers
 * regularise the bias weight like any other, and the penalty falls on {@code b} in one problem and
 * on {@code b'} in the other, so the optima differ by how far the constant term is shrunk. We take
 * that difference over dense rows; the centring is reported for explanation, never applied to
 * rows.
 *
 * <p>A column constant over the training rows ({@code σ_j = 0}) gets {@code s_j = 0}: it is zero in
 * every row. On the training rows it carries nothing but a constant, which the bias already
 * provides, and centred it would be zero there too; a zero column gets weight zero, so a new row in
 * which that token's count differs cannot move the score by a weight the data never constrained.
 * (The other common choice, a scale of 1, would let the column stand in for the bias.) Under
 * {@link Scaling#L2} and {@link Scaling#NONE} the means are 0 and the scales 1, so the same
 * identities hold with {@code b' = b}.
 *
 * <p>Instances are immutable and thread-safe; an {@link Encoder} is not, so each thread takes its
 * own.
 */
public final class FeatureSpace {

    /**
     * The newest version of {@link State} this build writes and reads. Version 2 adds
     * {@code min_df} and {@code sublinear}; a space without them is written as version 1, as
     * before.
     */
    public static final int FORMAT_VERSION = 2;
    /** The version of a state that has no setting of version 2. */
    public static final int FORMAT_VERSION_1 = 1;

    private final List<String> columns;
    private final FeatureConfig config;
    private final int trainingRows;
    private final int[] featureColumn;
    private final String[] tokens;
    private final String[] names;
    private final int[] documentFrequency;
    /** Ones unless the weighting is tfidf. */
    private final double[] idf;
    /** Zeros unless the scaling is standardize. */
    private final double[] means;
    /** Null unless the scaling is standardize. */
    private final double[] standardDeviations;
    /** Ones unless the scaling is standardize. */
    private final double[] scales;
    /** Per text column, token to feature index. */
    private final List<Map<String, Integer>> index;

    /**
     * Takes ownership of the arrays. {@code idf} is null unless the weighting is tfidf, and
     * {@code means} and {@code standardDeviations} are null unless the scaling is standardize.
     */
    FeatureSpace(List<String> columns, FeatureConfig config, int trainingRows, int[] featureColumn,
            String[] tokens, int[] documentFrequency, double[] idf, double[] means, double[] standardDeviations) {
        int m = tokens.length;
        this.columns = List.copyOf(columns);
        this.config = config;
        this.trainingRows = trainingRows;
        this.featureColumn = featureColumn;
        this.tokens = tokens;
        this.documentFrequency = documentFrequency;
        this.idf = idf != null ? idf : filled(m, 1.0);
        this.means = means != null ? means : new double[m];
        this.standardDeviations = standardDeviations;
        this.scales = filled(m, 1.0);
        if (standardDeviations != null) {
            for (int j = 0; j < m; j++) {
                scales[j] = standardDeviations[j] > 0.0 ? 1.0 / standardDeviations[j] : 0.0;
            }
        }
        this.names = new String[m];
        List<Map<String, Integer>> byColumn = new ArrayList<>(columns.size());
        for (int c = 0; c < columns.size(); c++) {
            byColumn.add(new HashMap<>());
        }
        for (int j = 0; j < m; j++) {
            names[j] = name(this.columns.get(featureColumn[j]), tokens[j]);
            byColumn.get(featureColumn[j]).put(tokens[j], j);
        }
        for (int c = 0; c < byColumn.size(); c++) {
            byColumn.set(c, Collections.unmodifiableMap(byColumn.get(c)));
        }
        this.index = List.copyOf(byColumn);
    }

    /**
     * Selects, weighs and scales as {@code config} says, from {@code rows} alone.
     *
     * @param columns the names of the text columns, distinct, in the order the rows list them
     * @param rows the training rows, each with one token list per column
     * @throws dev.pressmark.core.PressmarkException {@code empty-training-set} when there are no rows,
     *     {@code no-tokens} when they hold no token
     * @throws IllegalArgumentException when a row has the wrong number of token lists or a null
     *     token; the message names the row
     */
    public static FeatureSpace fit(FeatureConfig config, List<String> columns, List<List<List<String>>> rows) {
        return FeatureFitter.fit(config, columns, rows, ViewCaps.NONE);
    }

    /** As {@link #fit(FeatureConfig, List, List)}, with a cap on the features of each view as well. */
    public static FeatureSpace fit(FeatureConfig config, List<String> columns, List<List<List<String>>> rows,
            ViewCaps caps) {
        return FeatureFitter.fit(config, columns, rows, caps);
    }

    /**
     * Fits from rows that views scan one field at a time, holding a string only per distinct token;
     * the same space as {@link #fit(FeatureConfig, List, List, ViewCaps)} on the token lists of the
     * same rows with each token prefixed by its view's prefix.
     *
     * @param prefixes per view, what its tokens carry in front in the space ({@code ""} for a single view)
     * @param caps per view, the most features it may keep ({@link FeatureConfig#ALL} for no cap)
     */
    public static FeatureSpace fit(FeatureConfig config, List<String> columns, TokenSource source, List<String> prefixes,
            int[] caps) {
        return FeatureFitter.fit(config, columns, source, prefixes, caps);
    }

    /**
     * Per text column and view, the features of that view's tokens, looked up by span without the
     * view's prefix.
     */
    public SpanIndex[][] spanIndex(List<String> prefixes) {
        SpanIndex[][] spans = new SpanIndex[columns.size()][prefixes.size()];
        for (int c = 0; c < columns.size(); c++) {
            List<Map<String, Integer>> byView = new ArrayList<>();
            for (int v = 0; v < prefixes.size(); v++) {
                byView.add(new HashMap<>());
            }
            for (Map.Entry<String, Integer> entry : index.get(c).entrySet()) {
                String token = entry.getKey();
                for (int v = 0; v < prefixes.size(); v++) {
                    if (token.startsWith(prefixes.get(v)) && (prefixes.size() == 1 || !prefixes.get(v).isEmpty())) {
                        byView.get(v).put(token.substring(prefixes.get(v).length()), entry.getValue());
                        break;
                    }
                }
            }
            for (int v = 0; v < prefixes.size(); v++) {
                spans[c][v] = new SpanIndex(byView.get(v));
            }
        }
        return spans;
    }

    /** The feature rows of {@code source}'s rows, as {@link #transform(List)} gives them for their token lists. */
    public SparseMatrix transform(TokenSource source, List<String> prefixes) {
        SpanIndex[][] spans = spanIndex(prefixes);
        Encoder encoder = encoder();
        int m = featureCount();
        int[] cols = new int[m];
        double[] vals = new double[m];
        int[] column = new int[1];
        TokenSource.Sink sink = (v, chars, start, end) -> encoder.add(spans[column[0]][v].get(chars, start, end));
        SparseMatrix.Builder builder = SparseMatrix.builder(m);
        for (int i = 0; i < source.rows(); i++) {
            for (int c = 0; c < columns.size(); c++) {
                column[0] = c;
                source.scan(i, c, sink);
            }
            int length = encoder.finish(cols, vals);
            builder.addRow(Arrays.copyOf(cols, length), Arrays.copyOf(vals, length));
        }
        return builder.build();
    }

    /** True when a state of format 1 can hold this space. */
    public boolean fitsFormat1() {
        return config.fitsFormat1();
    }

    /** The feature rows of {@code rows}, one matrix row each, {@link #featureCount()} columns. */
    public SparseMatrix transform(List<List<List<String>>> rows) {
        Objects.requireNonNull(rows, "rows");
        Encoder encoder = encoder();
        int m = featureCount();
        int[] cols = new int[m];
        double[] vals = new double[m];
        SparseMatrix.Builder builder = SparseMatrix.builder(m);
        for (int i = 0; i < rows.size(); i++) {
            int length = encoder.encode(i, rows.get(i), cols, vals);
            builder.addRow(Arrays.copyOf(cols, length), Arrays.copyOf(vals, length));
        }
        return builder.build();
    }

    /** A new encoder of single rows that reuses its scratch space; for one thread at a time. */
    public Encoder encoder() {
        return new Encoder(this);
    }

    /** The number of features {@code m}. */
    public int featureCount() {
        return tokens.length;
    }

    /** {@code column:token} of feature {@code j}. */
    public String featureName(int j) {
        return names[Objects.checkIndex(j, names.length)];
    }

    /** The name of the text column of feature {@code j}. */
    public String column(int j) {
        return columns.get(featureColumn[Objects.checkIndex(j, featureColumn.length)]);
    }

    /** The token of feature {@code j}, without its column. */
    public String token(int j) {
        return tokens[Objects.checkIndex(j, tokens.length)];
    }

    /** Every token of text column {@code c} that is a feature, with its index. */
    public Map<String, Integer> tokensOf(int c) {
        return index.get(c);
    }

    /** The index of the feature of {@code token} in {@code column}, or -1 if it is not a feature. */
    public int indexOf(String column, String token) {
        int c = columns.indexOf(column);
        Integer j = c < 0 ? null : index.get(c).get(token);
        return j == null ? -1 : j;
    }

    /** The number of training rows in which feature {@code j} occurs. */
    public int documentFrequency(int j) {
        return documentFrequency[Objects.checkIndex(j, documentFrequency.length)];
    }

    /** The number of rows the space was fitted on. */
    public int trainingRows() {
        return trainingRows;
    }

    /** The text column names, in row order. */
    public List<String> columns() {
        return columns;
    }

    public FeatureConfig config() {
        return config;
    }

    /** The idf by which tfidf multiplies each feature; all ones under the other weightings. */
    public double[] idf() {
        return idf.clone();
    }

    /**
     * The mean {@code μ_j} of each weighted feature over the training rows, before scaling, under
     * standardize; all zeros under the other scalings.
     */
    public double[] means() {
        return means.clone();
    }

    /**
     * The factor {@code s_j} by which each weighted feature is multiplied: {@code 1 / σ_j}, or 0 for
     * a column constant over the training rows, under standardize; all ones under the other
     * scalings.
     */
    public double[] scales() {
        return scales.clone();
    }

    /**
     * The intercept of a model trained on this space's rows, re-expressed for centred features;
     * see {@link #centredIntercept(double[], double, double[], double[])}.
     */
    public double centredIntercept(double[] weights, double intercept) {
        if (weights.length != featureCount()) {
            throw new IllegalArgumentException("weights must have one entry per feature (" + featureCount()
                    + "), had " + weights.length);
        }
        return centredIntercept(weights, intercept, means, scales);
    }

    /**
     * {@code b' = b + Σ_j w_j s_j μ_j}: for every {@code x},
     * {@code w · (s ∘ x) + b = w · ((x - μ) ∘ s) + b'}. With {@code μ} the training means,
     * {@code b'} is the model's decision value at the mean training row, and also the mean of its
     * decision values over the training rows.
     *
     * @param weights the feature weights {@code w} of a model trained on the scaled rows
     * @param intercept its constant term {@code b} (the bias value times the bias weight)
     * @param means {@code μ}, as {@link #means()}
     * @param scales {@code s}, as {@link #scales()}
     */
    public static double centredIntercept(double[] weights, double intercept, double[] means, double[] scales) {
        if (means.length != weights.length || scales.length != weights.length) {
            throw new IllegalArgumentException("weights, means and scales must have equal lengths, had "
                    + weights.length + ", " + means.length + " and " + scales.length);
        }
        return FeatureKernels.centredIntercept(weights, intercept, means, scales);
    }

    /** The JSON-ready state: everything {@link #fromState} needs to rebuild this space. */
    public State toState() {
        List<Feature> features = new ArrayList<>(tokens.length);
        for (int j = 0; j < tokens.length; j++) {
            features.add(new Feature(column(j), tokens[j], documentFrequency[j]));
        }
        boolean tfidf = config.weighting() == Weighting.TFIDF;
        boolean standardize = config.scaling() == Scaling.STANDARDIZE;
        boolean format1 = fitsFormat1();
        return new State(format1 ? FORMAT_VERSION_1 : FORMAT_VERSION, columns, config.maxTokens(),
                config.weighting().key(), config.scaling().key(), trainingRows, features,
                tfidf ? boxed(idf) : null,
                standardize ? boxed(means) : null,
                standardize ? boxed(standardDeviations) : null,
                format1 ? null : config.minDf(),
                format1 ? null : config.sublinear());
    }

    /**
     * The space that {@code state} describes, after checking it: a known format version and keys,
     * one idf value per feature under tfidf, one mean and standard deviation per feature under
     * standardize, finite numbers, and no feature twice.
     *
     * @throws dev.pressmark.core.PressmarkException {@code invalid-features} naming what is wrong
     */
    public static FeatureSpace fromState(State state) {
        return StateReader.read(state);
    }

    static String name(String column, String token) {
        return column + ":" + token;
    }

    /** Checks that {@code row} has one non-null token list per column. */
    static void checkRow(int rowIndex, List<List<String>> row, List<String> columns) {
        if (row == null) {
            throw new IllegalArgumentException(where(rowIndex) + " is null");
        }
        if (row.size() != columns.size()) {
            throw new IllegalArgumentException(where(rowIndex) + " has " + row.size() + " token lists, expected "
                    + columns.size() + " (" + String.join(", ", columns) + ")");
        }
        for (int c = 0; c < row.size(); c++) {
            if (row.get(c) == null) {
                throw new IllegalArgumentException(where(rowIndex) + ": the token list of column "
                        + columns.get(c) + " is null");
            }
        }
    }

    static IllegalArgumentException nullToken(int rowIndex, String column, int position) {
        return new IllegalArgumentException(where(rowIndex) + ", column " + column + ": token " + position
                + " is null");
    }

    private static String where(int rowIndex) {
        return rowIndex < 0 ? "the row" : "row " + rowIndex;
    }

    private static double[] filled(int length, double value) {
        double[] a = new double[length];
        Arrays.fill(a, value);
        return a;
    }

    private static List<Double> boxed(double[] values) {
        List<Double> list = new ArrayList<>(values.length);
        for (double v : values) {
            list.add(v);
        }
        return Collections.unmodifiableList(list);
    }

    @Override
    public String toString() {
        return "FeatureSpace[" + featureCount() + " features over " + columns + ", " + config.weighting() + ", "
                + config.scaling() + ", fitted on " + trainingRows + " rows]";
    }

    /**
     * Turns one row at a time into its features, reusing a dense scratch array of the space's size.
     * Not thread-safe.
     */
    public static final class Encoder {

        private final FeatureSpace space;
        /** Occurrences per feature in the current row; all zero between rows. */
        private final int[] counts;
        /** The features of the current row, in the order first seen. */
        private final int[] seen;
        private final IndexSort sort;
        private int length;
        private int rowTokens;

        private Encoder(FeatureSpace space) {
            this.space = space;
            this.counts = new int[space.featureCount()];
            this.seen = new int[space.featureCount()];
            this.sort = new IndexSort(space.featureCount());
        }

        /**
         * Writes the features of {@code row} into {@code cols} (strictly increasing feature indices)
         * and {@code vals}, and returns how many it wrote. Both arrays must hold at least
         * {@link FeatureSpace#featureCount()} entries.
         */
        public int encode(List<List<String>> row, int[] cols, double[] vals) {
            requireRoom(cols, vals);
            return encode(-1, row, cols, vals);
        }

        int encode(int rowIndex, List<List<String>> row, int[] cols, double[] vals) {
            List<String> columns = space.columns;
            checkRow(rowIndex, row, columns);
            for (int c = 0; c < columns.size(); c++) {
                Map<String, Integer> tokenIndex = space.index.get(c);
                int position = 0;
                for (String token : row.get(c)) {
                    if (token == null) {
                        reset();
                        throw nullToken(rowIndex, columns.get(c), position);
                    }
                    Integer j = tokenIndex.get(token);
                    add(j == null ? -1 : j);
                    position++;
                }
            }
            return finish(cols, vals);
        }

        /**
         * Counts one token of the current row: feature {@code j}, or -1 for a token that is no
         * feature (it still counts towards the row's length).
         */
        public void add(int j) {
            rowTokens++;
            if (j >= 0 && counts[j]++ == 0) {
                seen[length++] = j;
            }
        }

        /**
         * Writes the features of the tokens {@link #add}ed since the last row into {@code cols}
         * (strictly increasing) and {@code vals}, weighted and scaled, starts a new row and returns
         * how many it wrote. Both arrays must hold at least {@link FeatureSpace#featureCount()}
         * entries.
         */
        public int finish(int[] cols, double[] vals) {
            requireRoom(cols, vals);
            int written = length;
            System.arraycopy(seen, 0, cols, 0, written);
            sort.sort(cols, written);
            FeatureKernels.weigh(space.config.weighting(), space.config.sublinear(), cols, written, counts, rowTokens,
                    space.idf, vals);
            switch (space.config.scaling()) {
                case L2 -> FeatureKernels.l2Normalize(vals, written);
                case STANDARDIZE -> written = FeatureKernels.scaleColumns(cols, vals, written, space.scales);
                case NONE -> { }
                default -> throw new IllegalArgumentException("unknown scaling " + space.config.scaling());
            }
            length = 0;
            rowTokens = 0;
            return written;
        }

        private void reset() {
            FeatureKernels.clear(counts, seen, length);
            length = 0;
            rowTokens = 0;
        }

        private void requireRoom(int[] cols, double[] vals) {
            int m = space.featureCount();
            if (cols.length < m || vals.length < m) {
                throw new IllegalArgumentException("cols and vals must have at least " + m
                        + " entries (one per feature), had " + cols.length + " and " + vals.length);
            }
        }
    }

    /**
     * A selected feature as stored.
     *
     * @param column the name of its text column
     * @param token the token
     * @param documentFrequency the number of training rows that hold it
     */
    public record Feature(
            @JsonProperty("column") String column,
            @JsonProperty("token") String token,
            @JsonProperty("document_frequency") int documentFrequency) {
    }

    /**
     * A fitted space as plain data, for the bundle's {@code features.json}. Lists are copied and
     * may be checked only by {@link FeatureSpace#fromState}, so that a damaged file is reported
     * with its fault rather than as a failed construction.
     *
     * @param formatVersion {@link FeatureSpace#FORMAT_VERSION}
     * @param columns the text column names, in row order
     * @param maxTokens the {@code features.max_tokens} the space was fitted with
     * @param weighting the {@link Weighting#key()}
     * @param scaling the {@link Scaling#key()}
     * @param trainingRows the number of rows the space was fitted on
     * @param features the selected features, in index order
     * @param idf one per feature under tfidf, else absent
     * @param means one per feature under standardize, else absent
     * @param standardDeviations one per feature (population, before scaling) under standardize,
     *     else absent
     * @param minDf the least document frequency of a feature; absent in format 1 (where it is 1)
     * @param sublinear whether counts weigh {@code 1 + ln c}; absent in format 1 (where they do not)
     */
    @JsonInclude(JsonInclude.Include.NON_NULL)
    public record State(
            @JsonProperty("format_version") int formatVersion,
            @JsonProperty("columns") List<String> columns,
            @JsonProperty("max_tokens") int maxTokens,
            @JsonProperty("weighting") String weighting,
            @JsonProperty("scaling") String scaling,
            @JsonProperty("training_rows") int trainingRows,
            @JsonProperty("features") List<Feature> features,
            @JsonProperty("idf") List<Double> idf,
            @JsonProperty("means") List<Double> means,
            @JsonProperty("standard_deviations") List<Double> standardDeviations,
            @JsonProperty("min_df") Integer minDf,
            @JsonProperty("sublinear") Boolean sublinear) {

        /** A state of format 1, which has no {@code min_df} and no {@code sublinear}. */
        public State(int formatVersion, List<String> columns, int maxTokens, String weighting, String scaling,
                int trainingRows, List<Feature> features, List<Double> idf, List<Double> means,
                List<Double> standardDeviations) {
            this(formatVersion, columns, maxTokens, weighting, scaling, trainingRows, features, idf, means,
                    standardDeviations, null, null);
        }

        public State {
            columns = copy(columns);
            features = copy(features);
            idf = copy(idf);
            means = copy(means);
            standardDeviations = copy(standardDeviations);
        }

        /** An unmodifiable copy that, unlike {@link List#copyOf}, keeps nulls for the checks to name. */
        private static <T> List<T> copy(List<T> list) {
            return list == null ? null : Collections.unmodifiableList(new ArrayList<>(list));
        }
    }
}
