package dev.pressmark.cli;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.ObjectWriter;
import com.fasterxml.jackson.dataformat.csv.CsvMapper;
import com.fasterxml.jackson.dataformat.csv.CsvSchema;
import dev.pressmark.core.PressmarkException;
import dev.pressmark.core.bundle.ScoredRows;
import java.util.List;

/**
 * CSV results: the input's columns, then {@code label}, {@code score} and, when the model gives
 * probabilities, {@code p:<label>} per label. Numbers are written with the digits the HTTP service
 * writes: the shortest that read back as the same double (Giulietti's Schubfach), in
 * {@link Double#toString(double)}'s layout, straight into the row's bytes by
 * {@link dev.pressmark.core.io.DoubleDigits}. JDK 17's own {@code Double.toString} took some 40 %
 * of the CPU of a batch and sometimes writes a digit more than needed. The header is Jackson's CSV
 * writer's; the rows are {@link CsvBytes}', which quotes as that writer does.
 */
final class CsvRowFormat implements RowFormat {

    private static final CsvMapper CSV = new CsvMapper();
    /** A first guess at a row's bytes, for the buffer of a chunk; it grows if short. */
    private static final int ROW_BYTES_GUESS = 160;

    private final List<String> labels;
    private final boolean probabilities;
    private final ObjectWriter headed;

    CsvRowFormat(List<String> inputColumns, List<String> labels, boolean probabilities) {
        this.labels = List.copyOf(labels);
        this.probabilities = probabilities;
        CsvSchema.Builder schema = CsvSchema.builder();
        inputColumns.forEach(schema::addColumn);
        ScoredRows.tableColumns(labels, probabilities).forEach(schema::addColumn);
        CsvSchema built = schema.build();
        this.headed = CSV.writer(built.withHeader());
    }

    @Override
    public byte[] header() {
        // Jackson writes the header with the first row; alone, it is the header of an empty table.
        return write(headed, List.of());
    }

    @Override
    public byte[] rows(RowChunk chunk, ScoredRows scored) {
        CsvBytes out = new CsvBytes(chunk.size() * ROW_BYTES_GUESS);
        for (int i = 0; i < chunk.size(); i++) {
            for (String value : chunk.rows().get(i)) {
                out.value(value);
            }
            out.value(labels.get(scored.label(i)));
            out.number(scored.score(i));
            for (int k = 0; probabilities && k < labels.size(); k++) {
                out.number(scored.probability(i, k));
            }
            out.endRow();
        }
        return out.toByteArray();
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
