package dev.pressmark.cli;

import com.fasterxml.jackson.core.io.JsonStringEncoder;
import com.fasterxml.jackson.core.io.NumberOutput;
import dev.pressmark.core.bundle.ScoredRows;
import java.nio.charset.StandardCharsets;
import java.util.List;

/**
 * JSON results as one document, {@code {"model": ..., "results": [...]}}, streamed: each result
 * an object of {@code label}, {@code score}, {@code probabilities} (when the model gives them)
 * and {@code unknown_tokens}, in input order. The layout is that of Jackson's default pretty
 * printer, which wrote the whole document at once before results were streamed, so the bytes are
 * unchanged; strings are escaped by Jackson's own encoder.
 */
final class JsonRowFormat implements RowFormat {

    private static final JsonStringEncoder ESCAPE = JsonStringEncoder.getInstance();

    private final String modelName;
    private final List<String> labels;
    private final boolean probabilities;
    /** Each label as a quoted, escaped key. */
    private final String[] labelKeys;

    JsonRowFormat(String modelName, List<String> labels, boolean probabilities) {
        this.modelName = modelName;
        this.labels = List.copyOf(labels);
        this.probabilities = probabilities;
        this.labelKeys = new String[labels.size()];
        for (int k = 0; k < labelKeys.length; k++) {
            labelKeys[k] = quoted(labels.get(k));
        }
    }

    @Override
    public byte[] header() {
        return ("{\n  \"model\" : " + quoted(modelName) + ",\n  \"results\" : [").getBytes(StandardCharsets.UTF_8);
    }

    @Override
    public byte[] rows(RowChunk chunk, ScoredRows scored) {
        StringBuilder out = new StringBuilder(chunk.size() * (probabilities ? 120 + 40 * labels.size() : 120));
        for (int i = 0; i < chunk.size(); i++) {
            out.append(i == 0 && chunk.index() == 0 ? " {" : ", {");
            out.append("\n    \"label\" : ").append(labelKeys[scored.label(i)]);
            out.append(",\n    \"score\" : ");
            number(out, scored.score(i));
            if (probabilities) {
                out.append(",\n    \"probabilities\" : {");
                for (int k = 0; k < labelKeys.length; k++) {
                    out.append(k == 0 ? "\n      " : ",\n      ").append(labelKeys[k]).append(" : ");
                    number(out, scored.probability(i, k));
                }
                out.append("\n    }");
            }
            out.append(",\n    \"unknown_tokens\" : ").append(scored.unknownTokens(i)).append("\n  }");
        }
        return out.toString().getBytes(StandardCharsets.UTF_8);
    }

    @Override
    public byte[] footer() {
        // one space before the bracket with or without results, as the pretty printer has it
        return " ]\n}\n".getBytes(StandardCharsets.UTF_8);
    }

    /**
     * As the HTTP service's Jackson writes a double: the shortest digits that read back as the same
     * value (its fast writer), non-finite values quoted.
     */
    private static void number(StringBuilder out, double value) {
        if (Double.isFinite(value)) {
            out.append(NumberOutput.toString(value, true));
        } else {
            out.append('"').append(value).append('"');
        }
    }

    private static String quoted(String text) {
        return "\"" + new String(ESCAPE.quoteAsString(text)) + "\"";
    }
}
