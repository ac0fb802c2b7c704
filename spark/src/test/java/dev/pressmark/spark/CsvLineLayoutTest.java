package dev.pressmark.spark;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.core.io.NumberOutput;
import com.fasterxml.jackson.dataformat.csv.CsvMapper;
import com.fasterxml.jackson.dataformat.csv.CsvSchema;
import dev.pressmark.core.bundle.Bundle;
import dev.pressmark.core.bundle.ScoredRows;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import org.apache.spark.sql.Row;
import org.apache.spark.sql.RowFactory;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * The job's CSV lines against Jackson's own CSV writer with its default settings
 * (jackson-dataformat-csv, the writer {@code pressmark predict --data}'s quoting follows): the same
 * line for the same values, awkward ones included. No Spark session: a layout is plain code.
 */
class CsvLineLayoutTest {

    /** Values that need quoting by one rule or another, and some that do not. */
    private static final List<String> AWKWARD = List.of("plain", "with space", "a,b", "say \"hi\"", "\"", "back\\slash",
            "x".repeat(CsvLineLayout.MAX_QUOTE_CHECK_CHARS), "x".repeat(CsvLineLayout.MAX_QUOTE_CHECK_CHARS + 1), "",
            "ünïcödé – 1/2in", "line\nbreak", "tab\there", " lead", "trail ", "p:x");

    @TempDir
    static Path dir;
    private static Bundle bundle;

    @BeforeAll
    static void train() {
        bundle = Bundle.read(TrainedBundles.subwords(dir));
    }

    /** What Jackson's CSV writer writes for {@code values} (null: an empty field) as one row, without its line feed. */
    private static String jackson(List<String> values) throws Exception {
        CsvSchema.Builder schema = CsvSchema.builder();
        for (int c = 0; c < values.size(); c++) {
            schema.addColumn("c" + c);
        }
        String line = new CsvMapper().writer(schema.build()).writeValueAsString(values.toArray());
        assertThat(line).endsWith("\n");
        return line.substring(0, line.length() - 1);
    }

    private static List<String> with(List<String> values, String... more) {
        List<String> all = new ArrayList<>(values);
        all.addAll(Arrays.asList(more));
        return all;
    }

    @Test
    void a_scored_row_is_the_line_jacksons_writer_writes_for_its_values_and_the_prediction() throws Exception {
        ScoredRows scored = new ScoredRows(1, bundle.labels().size(), true);
        bundle.score(List.<String[]>of(new String[] {"Vortaline pipe elbow 1/2in"}), PressmarkScorer.DEFAULT_MAX_TOKENS_PER_FIELD, scored);
        CsvLineLayout layout = new CsvLineLayout(List.of("title"), bundle.labels(), true, "v \"2\"");

        Row line = layout.row(RowFactory.create(AWKWARD.toArray()), scored, 0);

        List<String> expected = new ArrayList<>(AWKWARD);
        expected.add(bundle.labels().get(scored.label(0)));
        expected.add(NumberOutput.toString(scored.score(0), true));
        for (int l = 0; l < bundle.labels().size(); l++) {
            expected.add(NumberOutput.toString(scored.probability(0, l), true));
        }
        expected.add("v \"2\"");
        assertThat(line.length()).isEqualTo(1);
        assertThat(line.getString(0)).isEqualTo(jackson(expected));
    }

    @Test
    void null_cells_and_the_prediction_of_a_row_with_a_null_text_are_empty_fields() throws Exception {
        CsvLineLayout layout = new CsvLineLayout(List.of("title", "id"), bundle.labels(), true, "v2");
        List<String> expected = with(Arrays.asList(null, "7"), new String[3 + bundle.labels().size()]);

        Row line = layout.row(RowFactory.create(null, "7"), null, -1);

        assertThat(line.getString(0)).isEqualTo(jackson(expected)).isEqualTo(",7" + ",".repeat(3 + bundle.labels().size()));
    }

    @Test
    void the_header_names_the_input_columns_then_label_score_each_label_and_version_quoted_as_jackson_quotes_them() throws Exception {
        List<String> labels = List.of("pipes, \"wet\" work", "garden");
        CsvLineLayout withProbabilities = new CsvLineLayout(AWKWARD, labels, true, "v2");
        CsvLineLayout without = new CsvLineLayout(List.of("title"), labels, false, "v2");

        assertThat(withProbabilities.header().getString(0))
                .isEqualTo(jackson(with(AWKWARD, "label", "score", "p:pipes, \"wet\" work", "p:garden", "version")));
        assertThat(without.header().getString(0)).isEqualTo("title,label,score,version");
    }
}
