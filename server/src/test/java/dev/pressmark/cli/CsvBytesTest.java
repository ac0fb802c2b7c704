package dev.pressmark.cli;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.dataformat.csv.CsvMapper;
import com.fasterxml.jackson.dataformat.csv.CsvSchema;
import java.nio.charset.StandardCharsets;
import java.util.List;
import net.jqwik.api.Arbitraries;
import net.jqwik.api.Arbitrary;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.Provide;
import org.junit.jupiter.api.Test;

/**
 * {@link CsvBytes} against the reference it must match byte for byte: Jackson's CSV writer
 * (jackson-dataformat-csv, {@code CsvMapper} with a schema and its default settings), which wrote
 * {@code predict}'s rows before.
 */
class CsvBytesTest {

    private static final CsvMapper JACKSON = new CsvMapper();

    /** Chars around every boundary of the quoting rule and of UTF-8's byte lengths. */
    private static final String ALPHABET = "aZ09 ,\"\n\r\t\\#-.+;'~\u0001\u007f\u00e9\u00df\u07ff\u0800\u65e5\uffff";

    @Property(tries = 400)
    void writes_the_bytes_jacksons_csv_writer_writes(@ForAll("tables") List<List<String>> rows) throws Exception {
        assertThat(ours(rows)).isEqualTo(jacksons(rows));
    }

    /**
     * A number field is the bytes Jackson's CSV writer writes for the number's shortest digits
     * (the string {@code predict} wrote before numbers had a path of their own), and is never
     * quoted. Doubles of every kind: random bits (NaN payloads, subnormals, both infinities,
     * -0.0), probabilities, and the longest forms.
     */
    @Property(tries = 1000)
    void writes_a_number_as_jackson_writes_its_shortest_digits(@ForAll("doubles") double number, @ForAll boolean first)
            throws Exception {
        String digits = com.fasterxml.jackson.core.io.NumberOutput.toString(number, true);
        List<List<String>> row = first ? List.of(List.of(digits, "x")) : List.of(List.of("x", digits));
        CsvBytes out = new CsvBytes(1);
        if (first) {
            out.number(number);
            out.value("x");
        } else {
            out.value("x");
            out.number(number);
        }
        out.endRow();
        assertThat(out.toByteArray()).isEqualTo(jacksons(row));
    }

    @Provide
    Arbitrary<Double> doubles() {
        return Arbitraries.oneOf(
                Arbitraries.longs().map(Double::longBitsToDouble),
                Arbitraries.doubles().between(0, 1).ofScale(17),
                Arbitraries.of(-Double.MIN_NORMAL, -Double.MAX_VALUE, Double.MIN_VALUE, -0.0, Double.NaN,
                        Double.NEGATIVE_INFINITY, Double.POSITIVE_INFINITY, -2.2250738585072014E-308, 1e-7, 1e21));
    }

    @Test
    void quotes_as_jackson_does_at_the_length_where_it_stops_looking() throws Exception {
        String safe24 = "a".repeat(CsvBytes.MAX_QUOTE_CHECK_CHARS);
        List<List<String>> rows = List.of(List.of(safe24, safe24 + "a", "", "a\\b", "-0.5", "2.9E-5", "caf\u00e9"),
                List.of(" padded ", "say \"hi\"", "a,b", "line\nbreak", "\ud83d\ude00 pair", "\"", "x"));
        byte[] ours = ours(rows);
        assertThat(ours).isEqualTo(jacksons(rows));
        assertThat(new String(ours, StandardCharsets.UTF_8)).startsWith(safe24 + ",\"" + safe24 + "a\",,\"a\\b\",-0.5,2.9E-5,caf\u00e9\n");
    }

    @Provide
    Arbitrary<List<List<String>>> tables() {
        Arbitrary<String> text = Arbitraries.oneOf(
                Arbitraries.strings().withChars(ALPHABET).ofMinLength(0).ofMaxLength(40),
                Arbitraries.strings().withChars("ab\"").ofMinLength(20).ofMaxLength(30),
                Arbitraries.of("\ud83d\ude00", "a\ud83d\ude00b", "\ud83d\ude00\"\ud83d\ude00"));
        return Arbitraries.integers().between(1, 5).flatMap(columns ->
                text.list().ofSize(columns).list().ofMinSize(1).ofMaxSize(8));
    }

    private static byte[] ours(List<List<String>> rows) {
        CsvBytes out = new CsvBytes(8);
        for (List<String> row : rows) {
            row.forEach(out::value);
            out.endRow();
        }
        return out.toByteArray();
    }

    private static byte[] jacksons(List<List<String>> rows) throws Exception {
        CsvSchema.Builder schema = CsvSchema.builder();
        for (int c = 0; c < rows.get(0).size(); c++) {
            schema.addColumn("c" + c);
        }
        return JACKSON.writer(schema.build().withoutHeader()).writeValueAsBytes(rows);
    }
}
