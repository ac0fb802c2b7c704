package dev.pressmark.core.train;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import dev.pressmark.core.bundle.Bundle;
import dev.pressmark.core.bundle.Manifest;
import dev.pressmark.core.bundle.TextPipeline;
import dev.pressmark.core.drift.DriftProfile;
import dev.pressmark.core.drift.LengthSummary;
import dev.pressmark.core.evaluate.ConfusionMatrix;
import dev.pressmark.core.evaluate.Metric;
import dev.pressmark.core.evaluate.MetricSummary;
import dev.pressmark.core.evaluate.MetricValues;
import dev.pressmark.core.feature.FeatureConfig;
import dev.pressmark.core.feature.FeatureSpace;
import java.time.Instant;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.OptionalDouble;
import java.util.OptionalInt;
import java.util.OptionalLong;
import java.util.SortedMap;
import java.util.TreeMap;

/**
 * Turns a finished {@link TrainingRun} into bundle bytes: the manifest (provenance, the resolved
 * config, labels, metrics), the profile of the training rows, and the model itself.
 */
public final class BundleAssembler {

    /** The version of this library, written into every manifest. */
    public static final String LIBRARY_VERSION = libraryVersion();
    /** How many of the most frequent features the profile lists. */
    static final int PROFILE_TOKENS = 200;

    private static final ObjectMapper JSON = new ObjectMapper();

    private BundleAssembler() {
    }

    /**
     * The bundle of {@code result}. {@code created} goes into the manifest as is, so that the same
     * inputs and the same {@code created} give the same bytes.
     */
    public static byte[] assemble(TrainConfig config, LabelledData data, TrainingRun.Result result, Instant created) {
        return build(config, data, result, created).bytes();
    }

    /** {@link #assemble}, with the bundle its bytes hold. */
    static Bundle.Built build(TrainConfig config, LabelledData data, TrainingRun.Result result, Instant created) {
        return Bundle.build(manifest(config, data, result, created), result.labels(), result.pipeline(), result.model(),
                profile(result, data).toJson());
    }

    /** The manifest's parts that training records; {@link Bundle#build} adds the model's own. */
    static Manifest manifest(TrainConfig config, LabelledData data, TrainingRun.Result result, Instant created) {
        Optional<String> positive = result.positiveClass() >= 0
                ? Optional.of(result.labels().get(result.positiveClass())) : Optional.empty();
        // a search's bundle records the chosen candidate's config, which is what was trained
        Manifest.Provenance provenance = new Manifest.Provenance("pressmark " + LIBRARY_VERSION,
                System.getProperty("java.vendor") + " " + System.getProperty("java.version"),
                System.getProperty("os.name") + " " + System.getProperty("os.version") + " " + System.getProperty("os.arch"),
                config.split().seed(), data.sha256(), fileName(config),
                configJson(result.search() == null ? config : result.search().chosen()));
        TrainingRun.Grouping grouping = result.grouping();
        // groups only with data.group or data.duplicates: group, so that a config without either writes the training part it always did
        Manifest.Training training = new Manifest.Training(data.rows(), data.droppedRows(), result.trainRows().length,
                result.testRows().length, grouping == null ? OptionalInt.empty() : OptionalInt.of(grouping.groups()),
                grouping == null || Double.isNaN(grouping.testFractionAchieved()) ? OptionalDouble.empty()
                        : OptionalDouble.of(grouping.testFractionAchieved()),
                result.pipeline().features().featureCount(), result.pipeline().vocabularySize(), result.warnings());
        return Manifest.trained(config.name(), created.toString(), positive, provenance, training,
                metrics(result, config.data().weight() != null),
                Manifest.Sections.NONE.with(Manifest.SEARCH,
                        result.search() == null ? Optional.empty() : Optional.of(result.search().summary()))
                        .with(Manifest.DUPLICATES, Optional.of(result.duplicates())));
    }

    private static String fileName(TrainConfig config) {
        java.nio.file.Path name = java.nio.file.Path.of(config.data().file()).getFileName();
        return name == null ? config.data().file() : name.toString();
    }

    /** The resolved config as the manifest records it, the data file by name only. */
    static JsonNode configJson(TrainConfig config) {
        ObjectNode node = JSON.valueToTree(config.withData(new DataConfig(fileName(config), config.data().text(),
                config.data().label(), config.data().positive(), config.data().dropIncomplete(), config.data().group(),
                config.data().weight(), config.data().duplicates())));
        ObjectNode features = node.putObject("features");
        FeatureConfig settings = config.features();
        if (settings.maxTokens() == FeatureConfig.ALL) {
            features.put("max_tokens", "all");
        } else {
            features.put("max_tokens", settings.maxTokens());
        }
        features.put("weighting", settings.weighting().key());
        features.put("scaling", settings.scaling().key());
        if (settings.minDf() != FeatureConfig.DEFAULT_MIN_DF) {
            features.put("min_df", settings.minDf());
        }
        if (settings.sublinear()) {
            features.put("sublinear", true);
        }
        return node;
    }

    private static Manifest.Metrics metrics(TrainingRun.Result result, boolean weighted) {
        Map<String, Manifest.CvScore> cv = new TreeMap<>();
        for (MetricSummary summary : result.cv().metrics()) {
            List<Double> perFold = new ArrayList<>();
            for (double value : summary.perFold()) {
                perFold.add(value);
            }
            cv.put(summary.metric().key(), new Manifest.CvScore(summary.mean(), summary.standardError(), perFold));
        }
        Optional<SortedMap<String, SortedMap<String, Double>>> perClass = Optional.empty();
        if (result.labels().size() > 2) {
            SortedMap<String, SortedMap<String, Double>> classes = new TreeMap<>();
            for (int k = 0; k < result.labels().size(); k++) {
                classes.put(result.labels().get(k), values(result.test().perClass(k)));
            }
            perClass = Optional.of(classes);
        }
        ConfusionMatrix confusion = result.test().confusion();
        List<List<Long>> counts = new ArrayList<>();
        List<List<Double>> sums = new ArrayList<>();
        for (int t = 0; t < confusion.classCount(); t++) {
            List<Long> row = new ArrayList<>();
            List<Double> sumRow = new ArrayList<>();
            for (int p = 0; p < confusion.classCount(); p++) {
                row.add(confusion.count(t, p));
                sumRow.add(confusion.weight(t, p));
            }
            counts.add(row);
            sums.add(sumRow);
        }
        // with case weights the metrics sum weights; the counts are rows of weight > 0
        Manifest.Confusion matrix = new Manifest.Confusion(counts, weighted ? Optional.of(sums) : Optional.empty());
        return new Manifest.Metrics(new TreeMap<>(cv), values(result.test().overall()), perClass, Optional.of(matrix));
    }

    private static SortedMap<String, Double> values(MetricValues values) {
        SortedMap<String, Double> map = new TreeMap<>();
        for (Metric metric : values.metrics()) {
            map.put(metric.key(), values.get(metric));
        }
        return map;
    }

    /** What the training rows looked like, so that live traffic can be compared with it later. */
    static DriftProfile profile(TrainingRun.Result result, LabelledData data) {
        TextPipeline pipeline = result.pipeline();
        int[] trainRows = result.trainRows();
        long tokens = 0;
        long unknown = 0;
        long documentFrequencyTotal = 0;
        int[] lengths = new int[trainRows.length];
        for (int i = 0; i < lengths.length; i++) {
            // One row's tokens at a time: the training part's tokens all at once can take gigabytes.
            List<List<String>> row = TextPipeline.tokenize(pipeline.tokenizer(), List.<String[]>of(data.texts().get(trainRows[i])))
                    .get(0);
            for (List<String> column : row) {
                lengths[i] += column.size();
                documentFrequencyTotal += new HashSet<>(column).size();
            }
            tokens += lengths[i];
            unknown += pipeline.unknownTokens(row);
        }
        FeatureSpace features = pipeline.features();
        List<DriftProfile.TopFeature> top = new ArrayList<>();
        for (int j = 0; j < Math.min(PROFILE_TOKENS, features.featureCount()); j++) {
            top.add(new DriftProfile.TopFeature(features.featureName(j), features.documentFrequency(j)));
        }
        // Every distinct (field, token) of every row counted once: the document frequencies of all tokens, features or
        // not, summed. The drift index needs it for the share of tokens outside the top features.
        return new DriftProfile(trainRows.length, tokens, tokens == 0 ? 0.0 : (double) unknown / tokens, LengthSummary.of(lengths), top,
                OptionalLong.of(documentFrequencyTotal));
    }

    private static String libraryVersion() {
        String version = BundleAssembler.class.getPackage().getImplementationVersion();
        return version == null ? "development" : version;
    }
}
