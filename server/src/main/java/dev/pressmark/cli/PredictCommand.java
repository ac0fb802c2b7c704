package dev.pressmark.cli;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import com.fasterxml.jackson.dataformat.csv.CsvMapper;
import com.fasterxml.jackson.dataformat.csv.CsvSchema;
import dev.pressmark.core.PressmarkException;
import dev.pressmark.core.bundle.Bundle;
import dev.pressmark.core.bundle.Prediction;
import dev.pressmark.core.train.LabelledData;
import java.io.IOException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.concurrent.Callable;
import picocli.CommandLine;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

/** {@code pressmark predict}: local predictions from a bundle, as CSV or JSON. */
@Command(name = "predict", mixinStandardHelpOptions = true,
        description = "Predict with a bundle: texts on the command line (models with one input field) or the rows of a CSV file.")
final class PredictCommand implements Callable<Integer> {

    @Parameters(index = "0", paramLabel = "BUNDLE", description = "The bundle file.")
    Path bundle;

    @Parameters(index = "1..*", arity = "0..*", paramLabel = "TEXT", description = "Texts to classify, one item each.")
    List<String> texts = new ArrayList<>();

    @Option(names = "--data", paramLabel = "FILE", description = "A CSV file with a column for every input field.")
    Path data;

    @CommandLine.Spec
    CommandLine.Model.CommandSpec spec;

    @Option(names = "--format", paramLabel = "FORMAT", defaultValue = "csv", description = "csv or json (default: ${DEFAULT-VALUE}).")
    String format;

    @Override
    public Integer call() throws IOException {
        if (!format.equals("csv") && !format.equals("json")) {
            throw new PressmarkException("invalid-option", "--format must be csv or json, was \"" + format + "\"");
        }
        if ((data == null) == texts.isEmpty()) {
            throw new CommandLine.ParameterException(spec.commandLine(), "give either TEXT... or --data FILE");
        }
        Bundle model = Bundle.read(bundle);
        List<String> fields = model.inputFields();
        List<Map<String, String>> items = new ArrayList<>();
        if (data != null) {
            LabelledData rows = LabelledData.readTexts(data, fields);
            for (String[] row : rows.texts()) {
                Map<String, String> item = new LinkedHashMap<>();
                for (int c = 0; c < fields.size(); c++) {
                    item.put(fields.get(c), row[c]);
                }
                items.add(item);
            }
        } else {
            if (fields.size() != 1) {
                throw new PressmarkException("needs-data", "this model reads " + fields.size() + " fields (" + String.join(", ", fields)
                        + "); give them as columns of a CSV file with --data");
            }
            for (String text : texts) {
                items.add(Map.of(fields.get(0), text));
            }
        }
        List<Prediction> predictions = model.predict(items);
        if (format.equals("json")) {
            printJson(model, items, predictions);
        } else {
            printCsv(model, items, predictions);
        }
        return Main.EXIT_OK;
    }

    private static void printJson(Bundle model, List<Map<String, String>> items, List<Prediction> predictions) throws IOException {
        ObjectMapper json = new ObjectMapper();
        ObjectNode root = json.createObjectNode();
        root.put("model", model.name());
        ArrayNode results = root.putArray("results");
        for (Prediction prediction : predictions) {
            ObjectNode result = results.addObject();
            result.put("label", prediction.label());
            result.put("score", prediction.score());
            if (prediction.probabilities() != null) {
                ObjectNode probabilities = result.putObject("probabilities");
                prediction.probabilities().forEach(probabilities::put);
            }
            result.put("unknown_tokens", prediction.unknownTokens());
        }
        System.out.println(json.writerWithDefaultPrettyPrinter().writeValueAsString(root));
    }

    private static void printCsv(Bundle model, List<Map<String, String>> items, List<Prediction> predictions) throws IOException {
        CsvSchema.Builder schema = CsvSchema.builder();
        model.inputFields().forEach(schema::addColumn);
        schema.addColumn("label").addColumn("score");
        if (model.hasProbabilities()) {
            model.labels().forEach(label -> schema.addColumn("p:" + label));
        }
        List<List<String>> rows = new ArrayList<>();
        for (int i = 0; i < items.size(); i++) {
            List<String> row = new ArrayList<>();
            for (String field : model.inputFields()) {
                row.add(items.get(i).get(field));
            }
            Prediction prediction = predictions.get(i);
            row.add(prediction.label());
            row.add(Double.toString(prediction.score()));
            if (prediction.probabilities() != null) {
                prediction.probabilities().values().forEach(p -> row.add(Double.toString(p)));
            }
            rows.add(row);
        }
        System.out.print(new CsvMapper().writer(schema.build().withHeader()).writeValueAsString(rows));
    }
}
