package dev.pressmark.core.bundle;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import dev.pressmark.core.PressmarkException;
import dev.pressmark.core.classify.LinearClassifier;
import dev.pressmark.core.classify.LinearWeights;
import dev.pressmark.core.classify.PlattScaling;
import dev.pressmark.core.classify.ProbabilisticClassifier;
import dev.pressmark.core.feature.FeatureSpace;
import dev.pressmark.core.feature.SparseMatrix;
import java.io.IOException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.Comparator;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * A loaded bundle: the manifest, the text pipeline and the classifier, ready to predict and
 * explain. {@link #write} is the only way a bundle file is made, and {@link #read} checks every
 * entry's checksum on the way in. Immutable and thread-safe.
 */
public final class Bundle {

    /** Manifest keys this class reads and writes. */
    public static final String NAME = "name";
    public static final String LABELS = "labels";
    public static final String INPUT_FIELDS = "input_fields";
    public static final String CLASSIFIER = "classifier";
    /** No cut: every token of every field is scored. */
    public static final int ALL_TOKENS = Integer.MAX_VALUE;

    private static final ObjectMapper JSON = new ObjectMapper();

    private final JsonNode manifest;
    private final String name;
    private final List<String> labels;
    private final TextPipeline pipeline;
    private final ModelWeights model;
    private final LinearClassifier classifier;
    private final JsonNode profile;
    private final ThreadLocal<Scratch> scratch;

    private Bundle(JsonNode manifest, List<String> labels, TextPipeline pipeline, ModelWeights model, JsonNode profile) {
        this.manifest = manifest;
        this.name = manifest.path(NAME).asText();
        this.labels = List.copyOf(labels);
        this.pipeline = pipeline;
        this.model = model;
        this.classifier = model.classifier();
        this.profile = profile;
        this.scratch = ThreadLocal.withInitial(() -> new Scratch(pipeline));
    }

    /**
     * Writes a bundle. {@code manifest} holds everything but the parts this method adds: the
     * labels, the input fields, the classifier's kind and sigmoids, and the entry checksums.
     */
    public static byte[] write(ObjectNode manifest, List<String> labels, TextPipeline pipeline, ModelWeights model, JsonNode profile) {
        ObjectNode full = manifest.deepCopy();
        ArrayNode labelArray = full.putArray(LABELS);
        labels.forEach(labelArray::add);
        ArrayNode fields = full.putArray(INPUT_FIELDS);
        pipeline.columns().forEach(fields::add);
        ObjectNode classifierNode = full.putObject(CLASSIFIER);
        classifierNode.put("kind", model.kind());
        classifierNode.put("probabilities", model.hasProbabilities());
        ArrayNode sigmoids = classifierNode.putArray("platt");
        for (PlattScaling scaling : model.platt()) {
            sigmoids.addObject().put("a", scaling.a()).put("b", scaling.b());
        }
        Map<String, byte[]> entries = new LinkedHashMap<>();
        entries.put(BundleArchive.TOKENIZER, CanonicalJson.bytes(TokenizerViews.toJson(pipeline.views())));
        entries.put(BundleArchive.FEATURES, CanonicalJson.bytes(JSON.valueToTree(pipeline.features().toState())));
        entries.put(BundleArchive.WEIGHTS, WeightsCodec.write(model.weights()));
        entries.put(BundleArchive.PROFILE, CanonicalJson.bytes(profile));
        return BundleArchive.toBytes(full, entries,
                pipeline.fitsFormat1() ? BundleArchive.FORMAT_VERSION_1 : BundleArchive.FORMAT_VERSION);
    }

    public static Bundle read(Path file) {
        return from(BundleArchive.read(file), file.toString());
    }

    public static Bundle read(byte[] bytes) {
        return from(BundleArchive.read(bytes), "bundle");
    }

    /** Rebuilds the model from verified contents within {@link BundleLimits#DEFAULT}; {@code source} names it in messages. */
    public static Bundle from(BundleContents contents, String source) {
        return from(contents, source, BundleLimits.DEFAULT);
    }

    /**
     * Rebuilds the model from verified contents. The sizes that the entries declare (features,
     * vocabulary tokens) are checked against {@code limits} before anything is built from them; a
     * bundle past one is a {@link BundleException#LIMIT} naming it.
     */
    public static Bundle from(BundleContents contents, String source, BundleLimits limits) {
        JsonNode manifest = contents.manifest();
        try {
            List<String> labels = strings(manifest.path(LABELS));
            byte[] tokenizer = contents.entry(BundleArchive.TOKENIZER);
            byte[] featureState = contents.entry(BundleArchive.FEATURES);
            ArrayCounter.requireAtMost(tokenizer, BundleArchive.TOKENIZER, "vocabulary", limits.maxVocabularyTokens(), "tokens",
                    "a vocabulary's size");
            ArrayCounter.requireAtMost(featureState, BundleArchive.FEATURES, "features", limits.maxFeatures(), "features",
                    "a model's features");
            List<TokenizerSpec> views = TokenizerViews.read(tokenizer);
            FeatureSpace features = FeatureSpace.fromState(JSON.readValue(featureState, FeatureSpace.State.class));
            LinearWeights weights = WeightsCodec.read(contents.entry(BundleArchive.WEIGHTS), limits.maxFeatures());
            JsonNode classifierNode = manifest.path(CLASSIFIER);
            List<PlattScaling> platt = new ArrayList<>();
            for (JsonNode sigmoid : classifierNode.path("platt")) {
                platt.add(new PlattScaling(sigmoid.path("a").asDouble(), sigmoid.path("b").asDouble()));
            }
            ModelWeights model = new ModelWeights(classifierNode.path("kind").asText(), weights, platt);
            if (labels.size() != weights.numClasses()) {
                throw new IllegalArgumentException(labels.size() + " labels but weights for " + weights.numClasses() + " classes");
            }
            if (features.featureCount() != weights.numFeatures()) {
                throw new IllegalArgumentException(features.featureCount() + " features but weights for " + weights.numFeatures());
            }
            JsonNode profile = JSON.readTree(contents.entry(BundleArchive.PROFILE));
            TextPipeline pipeline = new TextPipeline(views, TextPipeline.tokenizer(views), features);
            if (contents.formatVersion() == BundleArchive.FORMAT_VERSION_1 && !pipeline.fitsFormat1()) {
                throw new IllegalArgumentException("its tokenizer or features need bundle format "
                        + BundleArchive.FORMAT_VERSION + ", but the manifest says " + BundleArchive.FORMAT_VERSION_1);
            }
            return new Bundle(manifest, labels, pipeline, model, profile);
        } catch (BundleException e) {
            throw new BundleException(e.code(), source + ": " + e.getMessage(), e);
        } catch (IOException | IllegalArgumentException | PressmarkException e) {
            throw new BundleException(BundleException.CORRUPT, source + ": not a usable model: " + e.getMessage(), e);
        }
    }

    private static List<String> strings(JsonNode array) {
        List<String> values = new ArrayList<>();
        array.forEach(node -> values.add(node.asText()));
        return values;
    }

    public String name() {
        return name;
    }

    public JsonNode manifest() {
        return manifest;
    }

    public JsonNode profile() {
        return profile;
    }

    public List<String> labels() {
        return labels;
    }

    /** The text fields an item must have, in feature order. */
    public List<String> inputFields() {
        return pipeline.columns();
    }

    public TextPipeline pipeline() {
        return pipeline;
    }

    public ModelWeights model() {
        return model;
    }

    public boolean hasProbabilities() {
        return model.hasProbabilities();
    }

    /** The label a score speaks for: the second label of a binary model, else the score's own. */
    public String labelOfScore(int score) {
        return model.weights().numScores() == 1 ? labels.get(1) : labels.get(score);
    }

    /** Every feature index, by descending weight in {@code score}, ties by feature name. */
    public List<Integer> featuresByWeight(int score) {
        LinearWeights weights = model.weights();
        FeatureSpace space = pipeline.features();
        List<Integer> order = new ArrayList<>(space.featureCount());
        for (int j = 0; j < space.featureCount(); j++) {
            order.add(j);
        }
        order.sort(Comparator.comparingDouble((Integer j) -> -weights.weight(score, j)).thenComparing(space::featureName));
        return order;
    }

    /** Predicts every item; each item maps every input field to its text. */
    public List<Prediction> predict(List<Map<String, String>> items) {
        return predict(items, ALL_TOKENS);
    }

    /**
     * Predicts every item with each field cut to its first {@code maxTokensPerField} tokens, so that
     * a huge text costs no more to score than a long one; {@link Prediction#truncatedTokens} tells
     * how much was cut.
     */
    public List<Prediction> predict(List<Map<String, String>> items, int maxTokensPerField) {
        requirePositive(maxTokensPerField);
        List<String[]> rows = rows(items);
        Scratch scratch = this.scratch.get();
        SparseMatrix.Builder builder = SparseMatrix.builder(pipeline.features().featureCount());
        int[] unknown = new int[rows.size()];
        int[] cut = new int[rows.size()];
        for (int i = 0; i < rows.size(); i++) {
            int length = scratch.encoder.encode(rows.get(i), maxTokensPerField, scratch.cols, scratch.vals);
            builder.addRow(Arrays.copyOf(scratch.cols, length), Arrays.copyOf(scratch.vals, length));
            unknown[i] = scratch.encoder.unknownTokens();
            cut[i] = scratch.encoder.droppedTokens();
        }
        SparseMatrix x = builder.build();
        List<Prediction> predictions = new ArrayList<>(rows.size());
        for (int i = 0; i < rows.size(); i++) {
            predictions.add(prediction(x, i, unknown[i], cut[i]));
        }
        return predictions;
    }

    /** One thread's encoder and row buffers, so that a request allocates nothing the size of the feature space. */
    private static final class Scratch {

        private final RowEncoder encoder;
        private final int[] cols;
        private final double[] vals;

        Scratch(TextPipeline pipeline) {
            this.encoder = pipeline.rowEncoder();
            this.cols = new int[pipeline.features().featureCount()];
            this.vals = new double[pipeline.features().featureCount()];
        }
    }

    /**
     * The tokens of each field of each item, uncut, as the training rows were tokenised; for
     * measuring traffic against the training profile. Predicting does not go through here.
     */
    public List<List<List<String>>> tokenize(List<Map<String, String>> items) {
        return TextPipeline.tokenize(pipeline.tokenizer(), rows(items));
    }

    private static void requirePositive(int maxTokensPerField) {
        if (maxTokensPerField < 1) {
            throw new IllegalArgumentException("maxTokensPerField must be >= 1, was " + maxTokensPerField);
        }
    }

    public Prediction predict(Map<String, String> item) {
        return predict(List.of(item)).get(0);
    }

    /** Predicts {@code item} and lists the {@code k} features that moved its score most. */
    public Explanation explain(Map<String, String> item, int k) {
        return explain(item, k, ALL_TOKENS);
    }

    /** {@link #explain(Map, int)} with each field cut to its first {@code maxTokensPerField} tokens. */
    public Explanation explain(Map<String, String> item, int k, int maxTokensPerField) {
        if (k < 0) {
            throw new IllegalArgumentException("k must be >= 0, was " + k);
        }
        requirePositive(maxTokensPerField);
        List<String[]> rows = rows(List.of(item));
        TextPipeline.Tokens cutTokens = TextPipeline.tokenize(pipeline.tokenizer(), rows, maxTokensPerField);
        List<List<List<String>>> tokens = cutTokens.rows();
        int[] cut = cutTokens.dropped();
        SparseMatrix x = pipeline.features().transform(tokens);
        Prediction prediction = prediction(x, 0, pipeline.unknownTokens(tokens.get(0)), cut[0]);
        LinearWeights weights = model.weights();
        int predicted = labels.indexOf(prediction.label());
        int score = weights.numScores() == 1 ? 0 : predicted;
        double sign = weights.numScores() == 1 && predicted == 0 ? -1.0 : 1.0;
        List<Contribution> all = new ArrayList<>();
        for (int p = x.rowStart(0); p < x.rowEnd(0); p++) {
            int j = x.column(p);
            double value = sign * weights.weight(score, j) * x.value(p);
            all.add(new Contribution(pipeline.features().featureName(j), value));
        }
        all.sort(Comparator.comparingDouble((Contribution c) -> -Math.abs(c.contribution())).thenComparing(Contribution::feature));
        return new Explanation(prediction, sign * weights.intercept(score), all.subList(0, Math.min(k, all.size())), all.size());
    }

    private Prediction prediction(SparseMatrix x, int row, int unknownTokens, int truncatedTokens) {
        LinearWeights weights = model.weights();
        double[] scores = new double[weights.numScores()];
        weights.decisionValues(x, row, scores);
        int predicted = weights.predict(x, row);
        double score = scores.length == 1 ? (predicted == 1 ? scores[0] : -scores[0]) : scores[predicted];
        Map<String, Double> probabilities = null;
        if (classifier instanceof ProbabilisticClassifier probabilistic) {
            double[] p = new double[labels.size()];
            probabilistic.probabilities(x, row, p);
            probabilities = new LinkedHashMap<>();
            for (int k = 0; k < p.length; k++) {
                probabilities.put(labels.get(k), p[k]);
            }
        }
        return new Prediction(labels.get(predicted), score, probabilities, unknownTokens, truncatedTokens);
    }

    private List<String[]> rows(List<Map<String, String>> items) {
        List<String> fields = pipeline.columns();
        List<String[]> rows = new ArrayList<>(items.size());
        for (int i = 0; i < items.size(); i++) {
            Map<String, String> item = items.get(i);
            String[] row = new String[fields.size()];
            for (int c = 0; c < row.length; c++) {
                String text = item.get(fields.get(c));
                if (text == null) {
                    throw new IllegalArgumentException("item " + i + " has no field \"" + fields.get(c)
                            + "\"; this model reads " + String.join(", ", fields));
                }
                row[c] = text;
            }
            rows.add(row);
        }
        return rows;
    }
}
