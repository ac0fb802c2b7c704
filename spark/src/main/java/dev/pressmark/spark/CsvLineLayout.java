package dev.pressmark.spark;

import dev.pressmark.core.bundle.ScoredRows;
import dev.pressmark.core.io.CsvQuoting;
import dev.pressmark.core.io.DoubleDigits;
import java.util.ArrayList;
import java.util.List;
import org.apache.spark.sql.Row;
import org.apache.spark.sql.RowFactory;

/**
 * Each scored row as one line of CSV, for a text table (the job's {@code --format csv}): the
 * input's values, then {@code label}, {@code score}, {@code p:<label>} per label when the model
 * gives probabilities, and {@code version}, filled straight from the batch's scores; the header
 * line goes first in each partition ({@link PartitionScorer} says which). The line is what {@code pressmark predict
 * --data} writes for the same row (its {@code CsvRowFormat}), with the version after it:
 *
 * <ul>
 *   <li>numbers in the shortest digits that read back as the same double ({@link DoubleDigits},
 *       Giulietti's Schubfach, the digits of Jackson's writer), in
 *       {@link Double#toString(double)}'s layout; JDK 17's own {@code Double.toString}, which
 *       Spark's CSV writer calls, is several times slower and sometimes writes a digit more;
 *   <li>RFC 4180 quoting by the rule of Jackson's CSV writer with its default settings
 *       ({@link CsvQuoting}, shared with {@code predict --data}); a quoted value doubles its
 *       quotes.
 * </ul>
 *
 * A null value (a null input cell; the prediction of a row with a null text) is an empty field,
 * as Spark's CSV writer writes it. Writing the lines as text spares Spark's CSV writer, which
 * reads each of a row's cells back from Spark's internal row into a new string.
 */
final class CsvLineLayout implements ScoredLayout {

    /** Values longer than this are quoted without being looked at ({@link CsvQuoting}). */
    static final int MAX_QUOTE_CHECK_CHARS = CsvQuoting.MAX_QUOTE_CHECK_CHARS;
    /** A first guess at a line's chars; the builder grows if short. */
    private static final int LINE_CHARS_GUESS = 160;
    private static final long serialVersionUID = 1L;

    private final List<String> labels;
    private final boolean probabilities;
    private final String version;
    private final String header;

    CsvLineLayout(List<String> inputColumns, List<String> labels, boolean probabilities, String version) {
        this.labels = List.copyOf(labels);
        this.probabilities = probabilities;
        this.version = version;
        StringBuilder line = new StringBuilder();
        for (String column : inputColumns) {
            field(line, column);
        }
        for (String column : predictionColumns(labels, probabilities)) {
            field(line, column);
        }
        this.header = ended(line);
    }

    /** The columns the prediction adds after the input's, in order. */
    static List<String> predictionColumns(List<String> labels, boolean probabilities) {
        List<String> names = new ArrayList<>(ScoredRows.tableColumns(labels, probabilities));
        names.add(PredictionColumn.VERSION);
        return names;
    }

    @Override
    public Row header() {
        return RowFactory.create(header);
    }

    @Override
    public Row row(Row input, ScoredRows scored, int k) {
        StringBuilder line = new StringBuilder(LINE_CHARS_GUESS);
        byte[] digits = new byte[DoubleDigits.MAX_BYTES];
        for (int c = 0; c < input.length(); c++) {
            field(line, input.isNullAt(c) ? null : input.get(c).toString());
        }
        if (k < 0) {
            for (int c = 0; c < 3 + (probabilities ? labels.size() : 0); c++) {
                field(line, null);
            }
        } else {
            field(line, labels.get(scored.label(k)));
            number(line, scored.score(k), digits);
            for (int l = 0; probabilities && l < labels.size(); l++) {
                number(line, scored.probability(k, l), digits);
            }
            field(line, version);
        }
        return RowFactory.create(ended(line));
    }

    /** Appends {@code value} (null: an empty field) and the separator after it to {@code line}. */
    private static void field(StringBuilder line, String value) {
        if (value == null) {
            line.append(',');
        } else if (!CsvQuoting.needsQuotes(value)) {
            line.append(value).append(',');
        } else {
            line.append('"');
            int from = 0;
            int quote;
            while ((quote = value.indexOf('"', from)) >= 0) {
                line.append(value, from, quote + 1).append('"');
                from = quote + 1;
            }
            line.append(value, from, value.length()).append("\",");
        }
    }

    /** Appends {@code value}'s shortest digits, which never need quotes, and the separator. */
    private static void number(StringBuilder line, double value, byte[] digits) {
        int length = DoubleDigits.write(value, digits, 0);
        for (int i = 0; i < length; i++) {
            line.append((char) digits[i]);
        }
        line.append(',');
    }

    /** {@code line} without the separator after its last field. */
    private static String ended(StringBuilder line) {
        return line.substring(0, line.length() - 1);
    }
}
