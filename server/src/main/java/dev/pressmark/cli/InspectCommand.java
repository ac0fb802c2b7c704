package dev.pressmark.cli;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import dev.pressmark.core.bundle.Bundle;
import dev.pressmark.core.bundle.Manifest;
import dev.pressmark.core.classify.LinearWeights;
import dev.pressmark.core.feature.FeatureSpace;
import java.io.IOException;
import java.nio.file.Path;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Optional;
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
        Manifest manifest = loaded.typedManifest();
        if (json) {
            Manifest shown = manifest.withListing(manifest.listing().map(Manifest.Listing::withoutEntries));
            System.out.println(new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT).writeValueAsString(shown.toJson()));
            return Main.EXIT_OK;
        }
        System.out.printf(Locale.ROOT, "name       %s%ncreated    %s%nlabels     %s%nfields     %s%nclassifier %s%n",
                loaded.name(), manifest.created().orElse(""), String.join(", ", loaded.labels()),
                String.join(", ", loaded.inputFields()), manifest.classifier().map(Manifest.Classifier::kind).orElse(""));
        Optional<Manifest.Provenance> provenance = manifest.provenance();
        System.out.printf(Locale.ROOT, "data       %s (sha256 %s)%n", provenance.map(Manifest.Provenance::dataFile).orElse(""),
                provenance.map(Manifest.Provenance::dataSha256).orElse(""));
        printRows(manifest);
        System.out.printf(Locale.ROOT, "%nmetric             cross-validation       test%n");
        Manifest.Metrics metrics = manifest.metrics().orElse(Manifest.Metrics.NONE);
        for (Map.Entry<String, Manifest.CvScore> metric : metrics.cv().entrySet()) {
            Double test = metrics.test().get(metric.getKey());
            System.out.printf(Locale.ROOT, "%-18s %.3f ± %-14.3f %.3f%n", metric.getKey(), metric.getValue().mean(),
                    metric.getValue().standardError(), test == null ? Double.NaN : test);
        }
        manifest.search().ifPresent(search -> System.out.printf(Locale.ROOT, "%n%s", SearchTable.render(search)));
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
    private static void printRows(Manifest manifest) {
        Optional<Manifest.Training> training = manifest.training();
        String groups = training.map(InspectCommand::groupsNote).orElse("");
        System.out.printf(Locale.ROOT, "rows       %,d training, %,d test%s%n", training.map(Manifest.Training::trainRows).orElse(0),
                training.map(Manifest.Training::testRows).orElse(0), groups);
        manifest.duplicates().ifPresent(duplicates -> System.out.printf(Locale.ROOT, "duplicates %s%n", duplicates.summary()));
    }

    /** "; N groups, test fraction achieved F" when the run had groups, else "". */
    private static String groupsNote(Manifest.Training training) {
        if (training.groups().isEmpty()) {
            return "";
        }
        String fraction = training.testFractionAchieved().isPresent()
                ? String.format(Locale.ROOT, ", test fraction achieved %.4f", training.testFractionAchieved().getAsDouble()) : "";
        return String.format(Locale.ROOT, "; %,d groups", training.groups().getAsInt()) + fraction;
    }
}
