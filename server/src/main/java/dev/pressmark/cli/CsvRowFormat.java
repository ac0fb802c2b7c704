package dev.pressmark.cli;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.core.io.NumberOutput;
import com.fasterxml.jackson.databind.ObjectWriter;
import com.fasterxml.jackson.dataformat.csv.CsvMapper;
import com.fasterxml.jackson.dataformat.csv.CsvSchema;
import dev.pressmark.core.PressmarkException;
import dev.pressmark.core.bundle.ScoredRows;
import java.util.ArrayList;
import java.util.Arrays;
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
    private final int columns;

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
        this.columns = built.size();
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
        List<List<String>> rows = new ArrayList<>(chunk.size());
        for (int i = 0; i < chunk.size(); i++) {
            String[] input = chunk.rows().get(i);
            String[] row = Arrays.copyOf(input, columns);
            int at = input.length;
            row[at++] = labels.get(scored.label(i));
            row[at++] = NumberOutput.toString(scored.score(i), true);
            for (int k = 0; probabilities && k < labels.size(); k++) {
                row[at++] = NumberOutput.toString(scored.probability(i, k), true);
            }
            rows.add(Arrays.asList(row));
        }
        return write(plain, rows);
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
