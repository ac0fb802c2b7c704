package dev.pressmark.core.bundle;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.node.ObjectNode;
import dev.pressmark.core.PressmarkException;
import dev.pressmark.core.classify.LinearClassifier;
import dev.pressmark.core.classify.LinearWeights;
import dev.pressmark.core.classify.ProbabilisticClassifier;
import dev.pressmark.core.feature.FeatureSpace;
import dev.pressmark.core.feature.SparseMatrix;
import java.io.IOException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;

/**
 * A loaded bundle: the manifest, the text pipeline and the classifier, ready to predict and
 * explain. {@link #write} is the only way a bundle file is made, and {@link #read} checks every
 * entry's checksum on the way in. Immutable and thread-safe.
 */
public final class Bundle {

    /** No cut: every token of every field is scored. */
    public static final int ALL_TOKENS = Integer.MAX_VALUE;

    private static final ObjectMapper JSON = new ObjectMapper();

    /** The manifest tree as the archive holds it, for showing it whole. */
    private final JsonNode manifest;
    private final Manifest typed;
    private final String name;
    private final List<String> labels;
    private final TextPipeline pipeline;
    private final ModelWeights model;
    private final LinearClassifier classifier;
    private final InterleavedWeights interleaved;
    private final JsonNode profile;
    private final ThreadLocal<Scratch> scratch;

    private Bundle(JsonNode manifest, Manifest typed, TextPipeline pipeline, ModelWeights model, JsonNode profile) {
        this.manifest = manifest;
        this.typed = typed;
        this.name = typed.name();
        this.labels = typed.labels();
        this.pipeline = pipeline;
        this.model = model;
        this.classifier = model.classifier();
        if (pipeline.features().featureCount() != model.weights().numFeatures()) {
            throw new IllegalArgumentException(pipeline.features().featureCount() + " features but weights for "
                    + model.weights().numFeatures());
        }
        this.interleaved = new InterleavedWeights(model.weights());
        this.profile = profile;
        this.scratch = ThreadLocal.withInitial(() -> new Scratch(pipeline));
    }

    /**
     * A bundle made in memory and its bytes, as {@link #read} would give them back: the report of
     * a fresh model needs no second reading of its own file.
     */
    public record Built(byte[] bytes, Bundle bundle) {
    }

    /**
     * Writes a bundle. {@code manifest} holds everything but the parts this method adds: the
     * labels, the input fields, the classifier's kind and sigmoids, and the entry checksums.
     */
    public static byte[] write(Manifest manifest, List<String> labels, TextPipeline pipeline, ModelWeights model, JsonNode profile) {
        return build(manifest, labels, pipeline, model, profile).bytes();
    }

    /** {@link #write}, with the bundle the bytes hold. */
    public static Built build(Manifest manifest, List<String> labels, TextPipeline pipeline, ModelWeights model, JsonNode profile) {
        if (labels.size() != model.weights().numClasses()) {
            throw new IllegalArgumentException(labels.size() + " labels but weights for " + model.weights().numClasses() + " classes");
        }
        ObjectNode tree = manifest.withModel(labels, pipeline.columns(), Manifest.Classifier.of(model)).withListing(Optional.empty())
                .toJson();
        Map<String, byte[]> entries = new LinkedHashMap<>();
        entries.put(BundleArchive.TOKENIZER, CanonicalJson.bytes(TokenizerViews.toJson(pipeline.views())));
        entries.put(BundleArchive.FEATURES, CanonicalJson.bytes(JSON.valueToTree(pipeline.features().toState())));
        entries.put(BundleArchive.WEIGHTS, WeightsCodec.write(model.weights()));
        byte[] profileBytes = CanonicalJson.bytes(profile);
        entries.put(BundleArchive.PROFILE, profileBytes);
        int formatVersion = pipeline.fitsFormat1() ? BundleArchive.FORMAT_VERSION_1 : BundleArchive.FORMAT_VERSION;
        byte[] bytes = BundleArchive.toBytes(tree, entries, formatVersion);
        try {
            // the trees as a reader of these bytes would parse them, numbers typed as the text has them
            JsonNode full = CanonicalJson.parse(CanonicalJson.bytes(BundleArchive.completeManifest(tree, entries, formatVersion)));
            return new Built(bytes, new Bundle(full, Manifest.read(full), pipeline, model, CanonicalJson.parse(profileBytes)));
        } catch (IOException e) {
            throw new IllegalStateException("canonical JSON written here could not be parsed again", e);
        }
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
            Manifest typed = Manifest.read(manifest);
            List<String> labels = typed.labels();
            byte[] tokenizer = contents.entry(BundleArchive.TOKENIZER);
            byte[] featureState = contents.entry(BundleArchive.FEATURES);
            ArrayCounter.requireAtMost(tokenizer, BundleArchive.TOKENIZER, "vocabulary", limits.maxVocabularyTokens(), "tokens",
                    "a vocabulary's size");
            ArrayCounter.requireAtMost(featureState, BundleArchive.FEATURES, "features", limits.maxFeatures(), "features",
                    "a model's features");
            List<TokenizerSpec> views = TokenizerViews.read(tokenizer);
            FeatureSpace features = FeatureSpace.fromState(JSON.readValue(featureState, FeatureSpace.State.class));
            LinearWeights weights = WeightsCodec.read(contents.entry(BundleArchive.WEIGHTS), limits.maxFeatures());
            Manifest.Classifier classifierPart = typed.classifier()
                    .orElseThrow(() -> new IllegalArgumentException("the manifest has no classifier"));
            ModelWeights model = new ModelWeights(classifierPart.kind(), weights, classifierPart.platt());
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
            return new Bundle(manifest, typed, pipeline, model, profile);
        } catch (BundleException e) {
            throw new BundleException(e.code(), source + ": " + e.getMessage(), e);
        } catch (IOException | IllegalArgumentException | PressmarkException e) {
            throw new BundleException(BundleException.CORRUPT, source + ": not a usable model: " + e.getMessage(), e);
        }
    }

    public String name() {
        return name;
    }

    /** The manifest tree as the bundle holds it (format version and entries included), for showing it whole. */
    public JsonNode manifest() {
        return manifest;
    }

    /** The manifest, typed. */
    public Manifest typedManifest() {
        return typed;
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
        List<Prediction> predictions = new ArrayList<>(rows.size());
        for (int i = 0; i < rows.size(); i++) {
            int length = scratch.encoder.encode(rows.get(i), maxTokensPerField, scratch.cols, scratch.vals);
            predictions.add(prediction(scratch.cols, scratch.vals, length, scratch.encoder.unknownTokens(),
                    scratch.encoder.droppedTokens()));
        }
        return predictions;
    }

    /**
     * Scores {@code rows} (each one text per {@link #inputFields() input field}, in that order) into
     * {@code out}, each field cut to its first {@code maxTokensPerField} tokens: the numbers of
     * {@link #predict(List, int)}, bit for bit, without a map or {@link Prediction} per row. For
     * scoring large tables; {@code out} must have room for every row and match this model's labels
     * and probabilities.
     */
    public void score(List<String[]> rows, int maxTokensPerField, ScoredRows out) {
        requirePositive(maxTokensPerField);
        if (rows.size() > out.capacity() || out.hasProbabilities() != hasProbabilities()
                || out.probabilities.length != (hasProbabilities() ? out.capacity() * labels.size() : 0)) {
            throw new IllegalArgumentException("out must hold " + rows.size() + " rows of " + labels.size()
                    + " labels " + (hasProbabilities() ? "with" : "without") + " probabilities");
        }
        int fields = pipeline.columns().size();
        for (int i = 0; i < rows.size(); i++) {
            if (rows.get(i).length != fields) {
                throw new IllegalArgumentException("row " + i + " has " + rows.get(i).length + " texts; this model reads " + fields);
            }
        }
        Scratch scratch = this.scratch.get();
        double[] scores = new double[model.weights().numScores()];
        double[] p = new double[hasProbabilities() ? labels.size() : 0];
        for (int i = 0; i < rows.size(); i++) {
            int length = scratch.encoder.encode(rows.get(i), maxTokensPerField, scratch.cols, scratch.vals);
            out.unknownTokens[i] = scratch.encoder.unknownTokens();
            out.truncatedTokens[i] = scratch.encoder.droppedTokens();
            int predicted = decide(scratch.cols, scratch.vals, length, scores, p);
            out.label[i] = predicted;
            out.score[i] = scoreOf(scores, predicted);
            System.arraycopy(p, 0, out.probabilities, i * p.length, p.length);
        }
        out.size = rows.size();
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
        int length = x.rowEnd(0) - x.rowStart(0);
        int[] cols = new int[length];
        double[] vals = new double[length];
        for (int at = 0; at < length; at++) {
            cols[at] = x.column(x.rowStart(0) + at);
            vals[at] = x.value(x.rowStart(0) + at);
        }
        Prediction prediction = prediction(cols, vals, length, pipeline.unknownTokens(tokens.get(0)), cut[0]);
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

    private Prediction prediction(int[] cols, double[] vals, int length, int unknownTokens, int truncatedTokens) {
        double[] scores = new double[model.weights().numScores()];
        double[] p = classifier instanceof ProbabilisticClassifier ? new double[labels.size()] : null;
        int predicted = decide(cols, vals, length, scores, p);
        Map<String, Double> probabilities = null;
        if (p != null) {
            probabilities = new LinkedHashMap<>();
            for (int k = 0; k < p.length; k++) {
                probabilities.put(labels.get(k), p[k]);
            }
        }
        return new Prediction(labels.get(predicted), scoreOf(scores, predicted), probabilities, unknownTokens, truncatedTokens);
    }

    /**
     * Writes the decision values of the feature row {@code cols}, {@code vals} ({@code length}
     * entries) into {@code scores} and, when the model gives them, its probabilities into
     * {@code probabilities}; returns the predicted label's index. The one place {@link #predict},
     * {@link #score} and {@link #explain} decide, so that they agree bit for bit. The dot products
     * are taken once, over the interleaved weights, and the label and probabilities come from them,
     * the same bits as the classifier's own {@code predict} and {@code probabilities} give.
     */
    private int decide(int[] cols, double[] vals, int length, double[] scores, double[] probabilities) {
        interleaved.decisionValues(cols, vals, length, scores);
        if (classifier instanceof ProbabilisticClassifier probabilistic) {
            probabilistic.probabilitiesOf(scores, probabilities);
        }
        return LinearWeights.classOf(scores);
    }

    /** The decision value for the predicted label: a binary model's margin signed towards it. */
    private static double scoreOf(double[] scores, int predicted) {
        return scores.length == 1 ? (predicted == 1 ? scores[0] : -scores[0]) : scores[predicted];
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
