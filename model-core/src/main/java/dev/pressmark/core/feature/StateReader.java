package dev.pressmark.core.feature;

import dev.pressmark.core.PressmarkException;
import java.util.HashSet;
import java.util.List;

/** Checks a {@link FeatureSpace.State} and rebuilds the space it describes. */
final class StateReader {

    static final String INVALID = "invalid-features";

    private StateReader() {
    }

    static FeatureSpace read(FeatureSpace.State state) {
        if (state == null) {
            throw invalid("the feature state is missing");
        }
        if (state.formatVersion() != FeatureSpace.FORMAT_VERSION_1 && state.formatVersion() != FeatureSpace.FORMAT_VERSION) {
            throw invalid("format_version " + state.formatVersion() + " is not supported; this build reads versions "
                    + FeatureSpace.FORMAT_VERSION_1 + " and " + FeatureSpace.FORMAT_VERSION);
        }
        boolean format1 = state.formatVersion() == FeatureSpace.FORMAT_VERSION_1;
        if (format1 != (state.minDf() == null) || format1 != (state.sublinear() == null)) {
            throw invalid("min_df and sublinear must be " + (format1 ? "absent in format_version 1" : "present in format_version 2"));
        }
        List<String> columns = state.columns();
        if (columns == null) {
            throw invalid("columns are missing");
        }
        try {
            FeatureFitter.checkColumns(columns);
        } catch (IllegalArgumentException e) {
            throw new PressmarkException(INVALID, e.getMessage(), e);
        }
        FeatureConfig config = config(state);
        int n = state.trainingRows();
        if (n < 1) {
            throw invalid("training_rows must be >= 1, was " + n);
        }
        List<FeatureSpace.Feature> features = state.features();
        if (features == null || features.isEmpty()) {
            throw invalid("features must list at least one feature");
        }
        int m = features.size();
        if (m > config.maxTokens()) {
            throw invalid("features has " + m + " entries, more than max_tokens = " + config.maxTokens());
        }
        int[] featureColumn = new int[m];
        String[] tokens = new String[m];
        int[] documentFrequency = new int[m];
        HashSet<String> seen = new HashSet<>();
        for (int j = 0; j < m; j++) {
            FeatureSpace.Feature feature = features.get(j);
            if (feature == null || feature.token() == null) {
                throw invalid("features[" + j + "] must have a column and a token");
            }
            featureColumn[j] = columns.indexOf(feature.column());
            if (featureColumn[j] < 0) {
                throw invalid("features[" + j + "] names column " + feature.column() + ", which is not one of "
                        + String.join(", ", columns));
            }
            tokens[j] = feature.token();
            documentFrequency[j] = feature.documentFrequency();
            if (documentFrequency[j] < config.minDf() || documentFrequency[j] > n) {
                throw invalid("features[" + j + "].document_frequency must be in [" + config.minDf() + ", " + n
                        + "] (min_df, training_rows), was " + documentFrequency[j]);
            }
            if (!seen.add(FeatureSpace.name(feature.column(), feature.token()))) {
                throw invalid("features[" + j + "] repeats " + FeatureSpace.name(feature.column(), feature.token()));
            }
        }
        boolean tfidf = config.weighting() == Weighting.TFIDF;
        boolean standardize = config.scaling() == Scaling.STANDARDIZE;
        double[] idf = values("idf", state.idf(), tfidf, m, config.weighting().key());
        double[] means = values("means", state.means(), standardize, m, config.scaling().key());
        double[] deviations = values("standard_deviations", state.standardDeviations(), standardize, m,
                config.scaling().key());
        for (int j = 0; tfidf && j < m; j++) {
            if (!(idf[j] > 0.0)) {
                throw invalid("idf[" + j + "] must be > 0, was " + idf[j]);
            }
        }
        for (int j = 0; standardize && j < m; j++) {
            if (!(deviations[j] >= 0.0)) {
                throw invalid("standard_deviations[" + j + "] must be >= 0, was " + deviations[j]);
            }
        }
        return new FeatureSpace(columns, config, n, featureColumn, tokens, documentFrequency, idf, means, deviations);
    }

    private static FeatureConfig config(FeatureSpace.State state) {
        try {
            return new FeatureConfig(state.maxTokens(), Weighting.fromKey(state.weighting()),
                    Scaling.fromKey(state.scaling()),
                    state.minDf() == null ? FeatureConfig.DEFAULT_MIN_DF : state.minDf(),
                    state.sublinear() != null && state.sublinear());
        } catch (IllegalArgumentException e) {
            throw new PressmarkException(INVALID, e.getMessage(), e);
        }
    }

    /**
     * The finite values of {@code field}, which must be present with one value per feature exactly
     * when {@code needed}; null when not needed.
     */
    private static double[] values(String field, List<Double> list, boolean needed, int m, String key) {
        if (!needed) {
            if (list != null) {
                throw invalid(field + " must be absent under " + key);
            }
            return null;
        }
        if (list == null) {
            throw invalid(field + " is missing; " + key + " needs one value per feature");
        }
        if (list.size() != m) {
            throw invalid(field + " must have one value per feature (" + m + "), had " + list.size());
        }
        double[] values = new double[m];
        for (int j = 0; j < m; j++) {
            Double v = list.get(j);
            if (v == null || !Double.isFinite(v)) {
                throw invalid(field + "[" + j + "] must be finite, was " + v);
            }
            values[j] = v;
        }
        return values;
    }

    private static PressmarkException invalid(String message) {
        return new PressmarkException(INVALID, message);
    }
}
