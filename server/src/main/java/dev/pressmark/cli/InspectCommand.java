package dev.pressmark.cli;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import com.fasterxml.jackson.databind.node.ObjectNode;
import dev.pressmark.core.bundle.Bundle;
import dev.pressmark.core.classify.LinearWeights;
import dev.pressmark.core.evaluate.DuplicateCounts;
import dev.pressmark.core.feature.FeatureSpace;
import dev.pressmark.core.search.SearchSummary;
import java.io.IOException;
import java.nio.file.Path;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

/** {@code pressmark inspect}: a bundle's manifest, metrics, labels and top weighted features. */
@Command(name = "inspect", mixinStandardHelpOptions = true,
        description = "Show a bundle's manifest, metrics, search candidates, label set and top weighted features.")
final class InspectCommand implements Callable<Integer> {

    @Parameters(index = "0", paramLabel = "BUNDLE", description = "The bundle file.")
    Path bundle;

    @Option(names = "--features", paramLabel = "N", defaultValue = "10", description = "Top features per label (default: ${DEFAULT-VALUE}).")
    int features;

    @Option(names = "--json", description = "Print the manifest as JSON.")
    boolean json;

    @Override
    public Integer call() throws IOException {
        Bundle loaded = Bundle.read(bundle);
        JsonNode manifest = loaded.manifest();
        if (json) {
            ObjectNode copy = manifest.deepCopy();
            copy.remove("entries");
            System.out.println(new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT).writeValueAsString(copy));
            return Main.EXIT_OK;
        }
        System.out.printf(Locale.ROOT, "name      %s%ncreated   %s%nlabels    %s%nfields    %s%nclassifier %s%n",
                loaded.name(), manifest.path("created").asText(), String.join(", ", loaded.labels()),
                String.join(", ", loaded.inputFields()), manifest.path("classifier").path("kind").asText());
        System.out.printf(Locale.ROOT, "data      %s (sha256 %s)%n", manifest.path("provenance").path("data_file").asText(),
                manifest.path("provenance").path("data_sha256").asText());
        printRows(manifest);
        System.out.printf(Locale.ROOT, "%nmetric             cross-validation       test%n");
        for (Map.Entry<String, JsonNode> metric : manifest.path("metrics").path("cv").properties()) {
            System.out.printf(Locale.ROOT, "%-18s %.3f ± %-14.3f %.3f%n", metric.getKey(), metric.getValue().path("mean").asDouble(),
                    metric.getValue().path("std_err").asDouble(), manifest.path("metrics").path("test").path(metric.getKey()).asDouble(Double.NaN));
        }
        SearchSummary search = SearchSummary.fromManifest(manifest);
        if (search != null) {
            System.out.printf(Locale.ROOT, "%n%s", SearchTable.render(search));
        }
        LinearWeights weights = loaded.model().weights();
        FeatureSpace space = loaded.pipeline().features();
        for (int score = 0; score < weights.numScores(); score++) {
            String label = loaded.labelOfScore(score);
            List<Integer> order = loaded.featuresByWeight(score);
            int s = score;
            System.out.printf(Locale.ROOT, "%ntop features for %s%n", label);
            for (int i = 0; i < Math.min(features, order.size()); i++) {
                System.out.printf(Locale.ROOT, "  %+.4f  %s%n", weights.weight(s, order.get(i)), space.featureName(order.get(i)));
            }
        }
        return Main.EXIT_OK;
    }

    /** The rows of each part, the groups when there were any, and the duplicate texts when recorded. */
    private static void printRows(JsonNode manifest) {
        JsonNode training = manifest.path("training");
        String groups = "";
        if (training.has("groups")) {
            groups = String.format(Locale.ROOT, "; %,d groups", training.path("groups").asInt())
                    + (training.has("test_fraction_achieved")
                            ? String.format(Locale.ROOT, ", test fraction achieved %.4f", training.path("test_fraction_achieved").asDouble())
                            : "");
        }
        System.out.printf(Locale.ROOT, "rows      %,d training, %,d test%s%n", training.path("train_rows").asInt(),
                training.path("test_rows").asInt(), groups);
        DuplicateCounts duplicates = DuplicateCounts.fromManifest(manifest);
        if (duplicates != null) {
            System.out.printf(Locale.ROOT, "duplicates %s%n", duplicates.summary());
        }
    }
}
