package dev.pressmark.core.train;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import dev.pressmark.core.PressmarkException;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

/** The {@code data.weight} column: read per row, every bad value an error naming file, line and value. */
class CaseWeightColumnTest {

    @TempDir
    Path dir;

    private Path csv(String content) throws IOException {
        Path file = dir.resolve("data.csv");
        Files.write(file, content.getBytes(StandardCharsets.UTF_8));
        return file;
    }

    private static DataConfig config(String weight) {
        return new DataConfig("data.csv", List.of("text"), "label", null, true, null, weight);
    }

    @Test
    void reads_one_case_weight_per_kept_row_and_skips_the_rows_left_out() throws IOException {
        Path file = csv("text,label,w\nred,a,2\n\"two\nlines\",b, 0.5 \nno label,,oops\nblue,a,0\nteal,b,1e1\n");
        LabelledData data = LabelledData.read(file, config("w"));
        assertThat(data.hasWeights()).isTrue();
        assertThat(data.weights()).containsExactly(2.0, 0.5, 0.0, 10.0);
        assertThat(data.droppedRows()).isEqualTo(1);
    }

    @Test
    void without_a_weight_column_no_weights_are_read() throws IOException {
        Path file = csv("text,label,w\nred,a,-3\n");
        LabelledData data = LabelledData.read(file, config(null));
        assertThat(data.hasWeights()).isFalse();
        assertThat(data.weights()).isNull();
    }

    @Test
    void a_missing_weight_column_is_named_with_the_columns_there_are() throws IOException {
        Path file = csv("text,label,group\nred,a,x\n");
        assertThatThrownBy(() -> LabelledData.read(file, config("weight")))
                .isInstanceOf(PressmarkException.class)
                .hasMessageContaining("no column \"weight\"")
                .hasMessageContaining("\"text\", \"label\", \"group\"");
    }

    @ParameterizedTest
    @ValueSource(strings = {"-1", "-0.001", "abc", "", "NaN", "Infinity", "-Infinity", "1e400", "0x1p3", "1d", "1,5"})
    void a_bad_case_weight_is_an_error_naming_file_line_and_value(String bad) throws IOException {
        String field = bad.contains(",") ? "\"" + bad + "\"" : bad;
        Path file = csv("text,label,w\nred,a,1\nblue,b," + field + "\n");
        assertThatThrownBy(() -> LabelledData.read(file, config("w")))
                .isInstanceOf(PressmarkException.class)
                .hasMessageContaining(file.toString())
                .hasMessageContaining("line 3")
                .hasMessageContaining("\"" + bad + "\"")
                .hasMessageContaining("\"w\"");
    }

    @Test
    void the_weight_column_cannot_be_the_label_or_a_text_column() {
        assertThatThrownBy(() -> new DataConfig("d.csv", List.of("text"), "label", null, false, null, "label"))
                .hasMessageContaining("data.weight");
        assertThatThrownBy(() -> new DataConfig("d.csv", List.of("text"), "label", null, false, null, "text"))
                .hasMessageContaining("data.weight");
        assertThatThrownBy(() -> new DataConfig("d.csv", List.of("text"), "label", null, false, null, " "))
                .hasMessageContaining("data.weight must name a column");
    }

    @Test
    void the_config_key_data_weight_names_the_column() {
        TrainConfig config = TrainConfig.parse("data: {file: d.csv, text: [text], label: label, weight: importance}\n", "t.yaml");
        assertThat(config.data().weight()).isEqualTo("importance");
        assertThat(TrainConfig.parse("data: {file: d.csv}\n", "t.yaml").data().weight()).isNull();
    }

    @Test
    void rows_of_a_test_file_without_weights_weigh_1_after_weighted_rows() throws IOException {
        Path file = csv("text,label,w\nred,a,3\n");
        Path other = dir.resolve("other.csv");
        Files.writeString(other, "text,label\nblue,b\n");
        LabelledData both = LabelledData.read(file, config("w")).followedBy(LabelledData.read(other, List.of("text"), "label", false));
        assertThat(both.weights()).containsExactly(3.0, 1.0);
    }
}
