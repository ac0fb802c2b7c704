package dev.pressmark.cli;

import com.fasterxml.jackson.core.JsonEncoding;
import com.fasterxml.jackson.core.JsonGenerator;
import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.core.io.NumberOutput;
import com.fasterxml.jackson.core.util.ByteArrayBuilder;
import com.fasterxml.jackson.databind.ObjectWriter;
import com.fasterxml.jackson.dataformat.csv.CsvMapper;
import com.fasterxml.jackson.dataformat.csv.CsvSchema;
import dev.pressmark.core.PressmarkException;
import dev.pressmark.core.bundle.ScoredRows;
import java.io.IOException;
import java.util.List;

/**
 * CSV results: the input's columns, then {@code label}, {@code score} and, when the model gives
 * probabilities, {@code p:<label>} per label. Numbers are written as the HTTP service writes them:
 * the shortest digits that read back as the same double (Jackson's fast writer, Giulietti's
 * Schubfach), in {@link Double#toString(double)}'s layout. JDK 17's own {@code Double.toString}
 * took some 40 % of the CPU of a batch and sometimes writes a digit more than needed. Quoting is
 * Jackson's CSV writer's.
 */
final class CsvRowFormat implements RowFormat {

    private static final CsvMapper CSV = new CsvMapper();

    private final List<String> labels;
    private final boolean probabilities;
    private final ObjectWriter headed;
    private final ObjectWriter plain;

    CsvRowFormat(List<String> inputColumns, List<String> labels, boolean probabilities) {
        this.labels = List.copyOf(labels);
        this.probabilities = probabilities;
        CsvSchema.Builder schema = CsvSchema.builder();
        inputColumns.forEach(schema::addColumn);
        schema.addColumn("label").addColumn("score");
        if (probabilities) {
            labels.forEach(label -> schema.addColumn("p:" + label));
        }
        CsvSchema built = schema.build();
        this.headed = CSV.writer(built.withHeader());
        this.plain = CSV.writer(built.withoutHeader());
    }

    @Override
    public byte[] header() {
        // Jackson writes the header with the first row; alone, it is the header of an empty table.
        return write(headed, List.of());
    }

    @Override
    public byte[] rows(RowChunk chunk, ScoredRows scored) {
        // Straight to a generator made as writeValueAsBytes makes its own, with the same calls its
        // list serialisers make (an outer array of row arrays, each value a string): the same
        // bytes, without a list and an array copied per row.
        ByteArrayBuilder bytes = new ByteArrayBuilder(chunk.size() * 64);
        try (JsonGenerator out = plain.createGenerator(bytes, JsonEncoding.UTF8)) {
            out.writeStartArray();
            for (int i = 0; i < chunk.size(); i++) {
                writeRow(out, chunk.rows().get(i), scored, i);
            }
            out.writeEndArray();
        } catch (IOException e) {
            throw new PressmarkException("output-failed", "cannot write CSV: " + e.getMessage(), e);
        }
        return bytes.toByteArray();
    }

    private void writeRow(JsonGenerator out, String[] input, ScoredRows scored, int row) throws IOException {
        out.writeStartArray();
        for (String value : input) {
            out.writeString(value);
        }
        out.writeString(labels.get(scored.label(row)));
        out.writeString(NumberOutput.toString(scored.score(row), true));
        for (int k = 0; probabilities && k < labels.size(); k++) {
            out.writeString(NumberOutput.toString(scored.probability(row, k), true));
        }
        out.writeEndArray();
    }

    @Override
    public byte[] footer() {
        return new byte[0];
    }

    private static byte[] write(ObjectWriter writer, List<List<String>> rows) {
        try {
            return writer.writeValueAsBytes(rows);
        } catch (JsonProcessingException e) {
            throw new PressmarkException("output-failed", "cannot write CSV: " + e.getOriginalMessage(), e);
        }
    }
}
