package dev.pressmark.core.train;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import dev.pressmark.core.bundle.Bundle;
import dev.pressmark.core.bundle.TextPipeline;
import dev.pressmark.core.drift.DriftProfile;
import dev.pressmark.core.evaluate.ConfusionMatrix;
import dev.pressmark.core.evaluate.DuplicateCounts;
import dev.pressmark.core.evaluate.Evaluation;
import dev.pressmark.core.evaluate.Metric;
import dev.pressmark.core.evaluate.MetricSummary;
import dev.pressmark.core.evaluate.MetricValues;
import dev.pressmark.core.feature.FeatureConfig;
import dev.pressmark.core.feature.FeatureSpace;
import dev.pressmark.core.search.SearchSummary;
import java.time.Instant;
import java.util.Arrays;
import java.util.HashSet;
import java.util.List;

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
        ObjectNode manifest = JSON.createObjectNode();
        manifest.put("name", config.name());
        manifest.put("created", created.toString());
        if (result.positiveClass() >= 0) {
            manifest.put("positive_label", result.labels().get(result.positiveClass()));
        }
        ObjectNode provenance = manifest.putObject("provenance");
        provenance.put("library", "pressmark " + LIBRARY_VERSION);
        provenance.put("java", System.getProperty("java.vendor") + " " + System.getProperty("java.version"));
        provenance.put("os", System.getProperty("os.name") + " " + System.getProperty("os.version") + " " + System.getProperty("os.arch"));
        provenance.put("seed", config.split().seed());
        provenance.put("data_sha256", data.sha256());
        provenance.put("data_file", fileName(config));
        // a search's bundle records the chosen candidate's config, which is what was trained
        provenance.set("config", configJson(result.search() == null ? config : result.search().chosen()));
        ObjectNode training = manifest.putObject("training");
        training.put("rows", data.rows());
        training.put("dropped_rows", data.droppedRows());
        training.put("train_rows", result.trainRows().length);
        training.put("test_rows", result.testRows().length);
        if (result.grouping() != null) {
            // only with data.group, so that a config without it writes the manifest it always did
            training.put("groups", result.grouping().groups());
            if (!Double.isNaN(result.grouping().testFractionAchieved())) {
                training.put("test_fraction_achieved", result.grouping().testFractionAchieved());
            }
        }
        training.put("features", result.pipeline().features().featureCount());
        training.put("vocabulary_size", result.pipeline().vocabularySize());
        ArrayNode warnings = training.putArray("warnings");
        result.warnings().forEach(warnings::add);
        manifest.set(DuplicateCounts.KEY, result.duplicates().toJson());
        manifest.set("metrics", metrics(result, config.data().weight() != null));
        if (result.search() != null) {
            manifest.set(SearchSummary.KEY, result.search().summary().toJson());
        }
        return Bundle.write(manifest, result.labels(), result.pipeline(), result.model(), profile(result, data));
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

    private static ObjectNode metrics(TrainingRun.Result result, boolean weighted) {
        ObjectNode metrics = JSON.createObjectNode();
        ObjectNode cv = metrics.putObject("cv");
        for (MetricSummary summary : result.cv().metrics()) {
            ObjectNode node = cv.putObject(summary.metric().key());
            node.put("mean", summary.mean());
            node.put("std_err", summary.standardError());
            ArrayNode perFold = node.putArray("per_fold");
            Arrays.stream(summary.perFold()).forEach(perFold::add);
        }
        metrics.set("test", values(result.test().overall()));
        if (result.labels().size() > 2) {
            ObjectNode perClass = metrics.putObject("test_per_class");
            for (int k = 0; k < result.labels().size(); k++) {
                perClass.set(result.labels().get(k), values(result.test().perClass(k)));
            }
        }
        ConfusionMatrix confusion = result.test().confusion();
        ArrayNode rows = metrics.putObject("test_confusion").putArray("counts");
        for (int t = 0; t < confusion.classCount(); t++) {
            ArrayNode row = rows.addArray();
            for (int p = 0; p < confusion.classCount(); p++) {
                row.add(confusion.count(t, p));
            }
        }
        if (weighted) {
            // with case weights the metrics sum weights; the counts above are rows of weight > 0
            ArrayNode sums = ((ObjectNode) metrics.get("test_confusion")).putArray("weights");
            for (int t = 0; t < confusion.classCount(); t++) {
                ArrayNode row = sums.addArray();
                for (int p = 0; p < confusion.classCount(); p++) {
                    row.add(confusion.weight(t, p));
                }
            }
        }
        return metrics;
    }

    private static ObjectNode values(MetricValues values) {
        ObjectNode node = JSON.createObjectNode();
        for (Metric metric : values.metrics()) {
            node.put(metric.key(), values.get(metric));
        }
        return node;
    }

    /** What the training rows looked like, so that live traffic can be compared with it later. */
    static ObjectNode profile(TrainingRun.Result result, LabelledData data) {
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
        ObjectNode profile = JSON.createObjectNode();
        profile.put("rows", trainRows.length);
        profile.put("tokens", tokens);
        profile.put("unknown_rate", tokens == 0 ? 0.0 : (double) unknown / tokens);
        // Every distinct (field, token) of every row counted once: the document frequencies of all tokens, features or
        // not, summed. The drift index needs it for the share of tokens outside the top features.
        profile.put(DriftProfile.DOCUMENT_FREQUENCY_TOTAL, documentFrequencyTotal);
        Arrays.sort(lengths);
        ObjectNode length = profile.putObject("tokens_per_row");
        length.put("mean", lengths.length == 0 ? 0.0 : (double) tokens / lengths.length);
        length.put("p10", quantile(lengths, 0.10));
        length.put("p50", quantile(lengths, 0.50));
        length.put("p90", quantile(lengths, 0.90));
        FeatureSpace features = pipeline.features();
        ArrayNode top = profile.putArray("top_features");
        for (int j = 0; j < Math.min(PROFILE_TOKENS, features.featureCount()); j++) {
            top.addObject().put("feature", features.featureName(j)).put("document_frequency", features.documentFrequency(j));
        }
        return profile;
    }

    /** The nearest-rank quantile of sorted values. */
    private static int quantile(int[] sorted, double q) {
        if (sorted.length == 0) {
            return 0;
        }
        int rank = (int) Math.ceil(q * sorted.length);
        return sorted[Math.max(0, Math.min(sorted.length - 1, rank - 1))];
    }

    private static String libraryVersion() {
        String version = BundleAssembler.class.getPackage().getImplementationVersion();
        return version == null ? "development" : version;
    }
}
