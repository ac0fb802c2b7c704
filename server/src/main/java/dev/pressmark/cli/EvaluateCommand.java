package dev.pressmark.cli;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.node.ObjectNode;
import dev.pressmark.core.PressmarkException;
import dev.pressmark.core.bundle.Bundle;
import dev.pressmark.core.bundle.Prediction;
import dev.pressmark.core.evaluate.Evaluation;
import dev.pressmark.core.evaluate.Metric;
import dev.pressmark.core.evaluate.MetricValues;
import dev.pressmark.core.train.LabelledData;
import java.io.IOException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

/** {@code pressmark evaluate}: the metrics of a bundle on new labelled data. */
@Command(name = "evaluate", mixinStandardHelpOptions = true,
        description = "Score a bundle on labelled data with the same columns it was trained on.")
final class EvaluateCommand implements Callable<Integer> {

    @Parameters(index = "0", paramLabel = "BUNDLE", description = "The bundle file.")
    Path bundle;

    @Option(names = "--data", required = true, paramLabel = "FILE", description = "A labelled CSV file.")
    Path data;

    @Option(names = "--json", description = "Print the metrics as JSON.")
    boolean json;

    @Override
    public Integer call() throws IOException {
        Bundle model = Bundle.read(bundle);
        String labelColumn = model.typedManifest().provenance().map(p -> p.labelColumn("label")).orElse("label");
        LabelledData rows = LabelledData.read(data, model.inputFields(), labelColumn, false);
        List<Map<String, String>> items = new ArrayList<>();
        for (String[] row : rows.texts()) {
            Map<String, String> item = new LinkedHashMap<>();
            for (int c = 0; c < row.length; c++) {
                item.put(model.inputFields().get(c), row[c]);
            }
            items.add(item);
        }
        List<String> labels = model.labels();
        int[] truth = new int[rows.rows()];
        for (int i = 0; i < truth.length; i++) {
            truth[i] = labels.indexOf(rows.labels().get(i));
            if (truth[i] < 0) {
                throw new PressmarkException("unknown-label", data + ": line " + rows.lines()[i] + ": label \"" + rows.labels().get(i)
                        + "\" is not one the model knows (" + String.join(", ", labels) + ")");
            }
        }
        List<Prediction> predictions = model.predict(items);
        int[] predicted = new int[truth.length];
        for (int i = 0; i < truth.length; i++) {
            predicted[i] = labels.indexOf(predictions.get(i).label());
        }
        Evaluation evaluation;
        if (labels.size() == 2) {
            int positive = labels.indexOf(model.typedManifest().positiveLabel().orElse(labels.get(1)));
            double[] scores = new double[truth.length];
            for (int i = 0; i < truth.length; i++) {
                scores[i] = predicted[i] == positive ? predictions.get(i).score() : -predictions.get(i).score();
            }
            evaluation = Evaluation.binary(truth, predicted, scores, positive);
        } else {
            evaluation = Evaluation.multiClass(truth, predicted, labels.size());
        }
        MetricValues values = evaluation.overall();
        if (json) {
            ObjectMapper mapper = new ObjectMapper();
            ObjectNode root = mapper.createObjectNode();
            root.put("rows", truth.length);
            ObjectNode metrics = root.putObject("metrics");
            for (Metric metric : values.metrics()) {
                metrics.put(metric.key(), values.get(metric));
            }
            System.out.println(mapper.writerWithDefaultPrettyPrinter().writeValueAsString(root));
        } else {
            System.out.printf(Locale.ROOT, "%s: %,d rows%n", data, truth.length);
            for (Metric metric : values.metrics()) {
                System.out.printf(Locale.ROOT, "%-18s %.3f%n", metric.key(), values.get(metric));
            }
        }
        return Main.EXIT_OK;
    }
}
