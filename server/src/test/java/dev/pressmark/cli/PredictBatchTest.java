package dev.pressmark.cli;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import com.fasterxml.jackson.core.JsonFactory;
import com.fasterxml.jackson.core.StreamWriteFeature;
import com.fasterxml.jackson.core.io.NumberOutput;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import com.fasterxml.jackson.dataformat.csv.CsvMapper;
import com.fasterxml.jackson.dataformat.csv.CsvParser;
import com.fasterxml.jackson.dataformat.csv.CsvSchema;
import dev.pressmark.core.PressmarkException;
import dev.pressmark.core.bundle.Bundle;
import dev.pressmark.core.bundle.Prediction;
import dev.pressmark.store.BundleStore;
import dev.pressmark.store.jdbc.JdbcStores;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.SplittableRandom;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import picocli.CommandLine;

/**
 * {@code pressmark predict --data}, streamed: its bytes against Jackson's CSV writer and pretty
 * printer fed with {@link Bundle#predict}'s answers (the layout before streaming), the same bytes
 * at any chunk size and thread count, input order kept, each bad input refused with where it is,
 * and a stored version scoring as its bundle file.
 */
class PredictBatchTest {

    private static final ObjectMapper JSON = new ObjectMapper();
    /** The model reads these fields; the files put them in another order, between other columns. */
    private static final List<String> FIELDS = List.of("title", "brand");
    private static final List<String> COLUMNS = List.of("brand", "id", "title");
    private static final List<String> LABELS = List.of("electrical", "garden", "plumbing");
    /** Texts that make Jackson's CSV writer quote, and characters beyond ASCII. */
    private static final List<String> ODD = List.of("a, b", "say \"hi\"", "two\nlines", "ünïcödé", "", " padded ", "日本");

    @TempDir
    Path dir;
    private Path bundleFile;
    private Bundle bundle;

    @BeforeEach
    void a_bundle_with_probabilities() throws IOException {
        bundleFile = dir.resolve("m.pmb");
        Files.write(bundleFile, LoadableBundles.of(5, FIELDS, LABELS, 40, true));
        bundle = Bundle.read(bundleFile);
        assertThat(bundle.hasProbabilities()).isTrue();
    }

    @Test
    void csv_results_are_the_input_columns_then_label_score_and_probabilities_as_jacksons_writer_writes_them() throws IOException {
        // numbers as Jackson's fast double writer writes them (the HTTP service's setting)
        List<List<String>> rows = rows(300, 1);
        Path data = csv("in.csv", rows);
        List<Prediction> predictions = bundle.predict(items(rows));
        CsvSchema.Builder schema = CsvSchema.builder();
        COLUMNS.forEach(schema::addColumn);
        schema.addColumn("label").addColumn("score");
        LABELS.forEach(label -> schema.addColumn("p:" + label));
        List<List<String>> expected = new ArrayList<>();
        for (int i = 0; i < rows.size(); i++) {
            List<String> row = new ArrayList<>(rows.get(i));
            row.add(predictions.get(i).label());
            row.add(NumberOutput.toString(predictions.get(i).score(), true));
            predictions.get(i).probabilities().values().forEach(p -> row.add(NumberOutput.toString(p, true)));
            expected.add(row);
        }
        String reference = new CsvMapper().writer(schema.build().withHeader()).writeValueAsString(expected);

        assertThat(Files.readString(predict(BatchScorer.DEFAULT_CHUNK_ROWS, "--data", data.toString()), StandardCharsets.UTF_8))
                .isEqualTo(reference);
    }

    @Test
    void every_number_written_reads_back_as_exactly_the_models_double() throws IOException {
        List<List<String>> rows = rows(500, 3);
        Path data = csv("in.csv", rows);
        List<Prediction> predictions = bundle.predict(items(rows));
        List<Map<String, String>> written = new ArrayList<>();
        try (var it = new CsvMapper().readerFor(Map.class).with(CsvSchema.emptySchema().withHeader())
                .<Map<String, String>>readValues(predict(BatchScorer.DEFAULT_CHUNK_ROWS, "--data", data.toString()).toFile())) {
            it.forEachRemaining(written::add);
        }
        assertThat(written).hasSize(rows.size());
        for (int i = 0; i < rows.size(); i++) {
            Prediction expected = predictions.get(i);
            // Double.parseDouble is the JDK's correctly rounded reader: equal bits, not merely close
            assertThat(Double.doubleToLongBits(Double.parseDouble(written.get(i).get("score"))))
                    .isEqualTo(Double.doubleToLongBits(expected.score()));
            for (Map.Entry<String, Double> p : expected.probabilities().entrySet()) {
                assertThat(Double.doubleToLongBits(Double.parseDouble(written.get(i).get("p:" + p.getKey()))))
                        .isEqualTo(Double.doubleToLongBits(p.getValue()));
            }
        }
    }

    @Test
    void json_results_are_the_document_jacksons_pretty_printer_writes() throws IOException {
        List<List<String>> rows = rows(120, 2);
        Path data = csv("in.csv", rows);
        ObjectNode root = JSON.createObjectNode();
        root.put("model", bundle.name());
        ArrayNode results = root.putArray("results");
        for (Prediction prediction : bundle.predict(items(rows))) {
            ObjectNode result = results.addObject();
            result.put("label", prediction.label());
            result.put("score", prediction.score());
            ObjectNode probabilities = result.putObject("probabilities");
            prediction.probabilities().forEach(probabilities::put);
            result.put("unknown_tokens", prediction.unknownTokens());
        }
        // as the HTTP service writes doubles: Jackson's fast writer (PressmarkServer's JsonFactory)
        ObjectMapper served = new ObjectMapper(JsonFactory.builder().enable(StreamWriteFeature.USE_FAST_DOUBLE_WRITER).build());
        String reference = served.writerWithDefaultPrettyPrinter().writeValueAsString(root) + "\n";

        assertThat(Files.readString(predict(5, "--data", data.toString(), "--format", "json"), StandardCharsets.UTF_8)).isEqualTo(reference);
    }

    @Test
    void an_input_with_no_rows_gives_the_header_alone_or_an_empty_result_list() throws IOException {
        Path data = csv("empty.csv", List.of());
        assertThat(Files.readString(predict(3, "--data", data.toString()))).isEqualTo(
                "brand,id,title,label,score,p:electrical,p:garden,p:plumbing\n");
        assertThat(JSON.readTree(predict(3, "--data", data.toString(), "--format", "json", "--force").toFile()).path("results").size()).isZero();
    }

    @Test
    void any_chunk_size_and_thread_count_give_the_same_bytes() throws IOException {
        Path data = csv("in.csv", rows(1500, 3));
        for (String format : List.of("csv", "json")) {
            byte[] once = Files.readAllBytes(predict(100_000, "--data", data.toString(), "--format", format, "--threads", "1", "--force"));
            for (int chunk : new int[] {1, 7, 256}) {
                for (String threads : List.of("1", "2", "5")) {
                    byte[] streamed = Files.readAllBytes(predict(chunk, "--data", data.toString(), "--format", format, "--threads", threads, "--force"));
                    assertThat(streamed).as("%s, chunks of %d rows, %s threads", format, chunk, threads).isEqualTo(once);
                }
            }
        }
    }

    @Test
    void rows_come_out_in_input_order() throws IOException {
        List<List<String>> rows = rows(2000, 4);
        Path data = csv("in.csv", rows);
        String written = Files.readString(predict(3, "--data", data.toString(), "--threads", "4"));
        List<String> ids = new ArrayList<>();
        new CsvMapper().readerFor(String[].class).with(CsvParser.Feature.WRAP_AS_ARRAY).<String[]>readValues(written)
                .forEachRemaining(row -> ids.add(row[1]));
        List<String> expected = new ArrayList<>(List.of("id"));
        rows.forEach(row -> expected.add(row.get(1)));
        assertThat(ids).isEqualTo(expected);
    }

    @Test
    void a_row_missing_an_input_field_is_refused_naming_its_line_and_nothing_is_written() throws IOException {
        Path data = dir.resolve("bad.csv");
        Files.writeString(data, "brand,id,title\nAquaward,1,ball valve\nAquaward,2\nAquaward,3,tap\n");
        assertThatThrownBy(() -> predict(2, "--data", data.toString()))
                .isInstanceOf(PressmarkException.class)
                .hasMessage(data + ": line 3: no value for the input field \"title\" (column 3): the row has 2 fields, the header 3;"
                        + " fix the row, or give --skip-bad-rows to leave such rows out and count them");
        assertThat(dir.resolve("out.txt")).doesNotExist();
        assertThat(Files.list(dir)).noneMatch(file -> file.getFileName().toString().endsWith(".tmp"));
    }

    @Test
    @Tag("slow") // a child JVM
    void skip_bad_rows_leaves_them_out_counts_them_and_names_their_lines() throws IOException {
        Files.write(dir.resolve("m.pmb"), LoadableBundles.of(5, FIELDS, LABELS, 40, true));
        Files.writeString(dir.resolve("bad.csv"), "brand,id,title\nA,1,w1\nA,2\nA,3,w3\n\"B\nC\",4\nA,5,w5,extra\nA,6,w6\n");
        CommandRun run = CommandRun.run(dir, "predict", "m.pmb", "--data", "bad.csv", "--skip-bad-rows", "--out", "out.csv");
        assertThat(run.exitCode()).as(run.err()).isZero();
        assertThat(run.err()).contains("predict: 3 rows in ", "3 bad rows left out (lines 3, 5, 7)");
        List<String> lines = Files.readAllLines(dir.resolve("out.csv"));
        assertThat(lines).hasSize(4);
        assertThat(lines.subList(1, 4)).extracting(line -> line.split(",")[1]).containsExactly("1", "3", "6");
    }

    @Test
    void invalid_utf8_is_refused_naming_its_line_and_byte_offset() throws IOException {
        Path data = dir.resolve("latin1.csv");
        byte[] head = "brand,id,title\nA,1,caf".getBytes(StandardCharsets.US_ASCII);
        byte[] bytes = new byte[head.length + 2];
        System.arraycopy(head, 0, bytes, 0, head.length);
        bytes[head.length] = (byte) 0xE9; // "é" in ISO 8859-1, not UTF-8
        bytes[head.length + 1] = '\n';
        Files.write(data, bytes);
        assertThatThrownBy(() -> predict(2, "--data", data.toString()))
                .isInstanceOf(PressmarkException.class)
                .hasMessage(data + ": line 2: invalid UTF-8 at byte offset " + head.length);
    }

    @Test
    void an_existing_out_file_is_refused_without_force_and_replaced_with_it() throws IOException {
        Path data = csv("in.csv", rows(10, 5));
        Path out = dir.resolve("out.txt");
        Files.writeString(out, "keep me");
        PredictCommand command = new PredictCommand();
        new CommandLine(command).parseArgs(bundleFile.toString(), "--data", data.toString(), "--out", out.toString());
        assertThatThrownBy(command::call).isInstanceOf(PressmarkException.class)
                .hasMessage(out + ": already exists; give --force to replace it");
        assertThat(Files.readString(out)).isEqualTo("keep me");
        assertThat(Files.readString(predict(2, "--data", data.toString(), "--force"))).startsWith("brand,id,title,label,");
    }

    @Test
    void a_stored_version_scores_as_its_bundle_file_and_an_unknown_tag_is_refused() throws IOException {
        Path data = csv("in.csv", rows(200, 6));
        String store = "sqlite:" + dir.resolve("store.db");
        try (BundleStore s = JdbcStores.open(store)) {
            s.publish("routing", "1.0.0", Files.readAllBytes(bundleFile), "test");
            s.publish("routing", "1.1.0", LoadableBundles.of(9, FIELDS, LABELS, 40, true), "test");
            s.activate("routing", "1.0.0", "test", "start");
        }
        byte[] fromFile = Files.readAllBytes(predict(64, "--data", data.toString(), "--force"));
        assertThat(Files.readAllBytes(predictStored(List.of("--model", "routing:1.0.0", "--store", store, "--data", data.toString()))))
                .isEqualTo(fromFile);
        assertThat(Files.readAllBytes(predictStored(List.of("--model", "routing", "--store", store, "--data", data.toString()))))
                .as("the active version").isEqualTo(fromFile);
        assertThat(Files.readAllBytes(predictStored(List.of("--model", "routing:1.1.0", "--store", store, "--data", data.toString()))))
                .as("another version").isNotEqualTo(fromFile);
        assertThatThrownBy(() -> predictStored(List.of("--model", "routing:9.9.9", "--store", store, "--data", data.toString())))
                .hasMessageContaining("9.9.9");
    }

    /** Runs predict in this JVM on {@link #bundleFile} into {@code out.txt} with chunks of {@code chunkRows}; returns the file. */
    private Path predict(int chunkRows, String... args) {
        List<String> all = new ArrayList<>(List.of(bundleFile.toString()));
        all.addAll(List.of(args));
        return run(chunkRows, all);
    }

    private Path predictStored(List<String> args) {
        return run(BatchScorer.DEFAULT_CHUNK_ROWS, new ArrayList<>(args));
    }

    private Path run(int chunkRows, List<String> args) {
        Path out = dir.resolve("out.txt");
        args.addAll(List.of("--out", out.toString()));
        if (!args.contains("--force")) {
            args.add("--force");
        }
        PredictCommand command = new PredictCommand();
        command.chunkRows = chunkRows;
        new CommandLine(command).parseArgs(args.toArray(new String[0]));
        try {
            assertThat(command.call()).isZero();
        } catch (IOException e) {
            throw new AssertionError(e);
        }
        return out;
    }

    /** {@code count} rows of {@link #COLUMNS}: words the model knows, words it does not, and {@link #ODD} texts. */
    private static List<List<String>> rows(int count, long seed) {
        SplittableRandom random = new SplittableRandom(seed);
        List<List<String>> rows = new ArrayList<>();
        for (int i = 0; i < count; i++) {
            StringBuilder title = new StringBuilder();
            int words = random.nextInt(0, 8);
            for (int w = 0; w < words; w++) {
                title.append(w == 0 ? "" : " ").append(random.nextInt(4) == 0 ? "zz" + random.nextInt(100) : "w" + random.nextInt(40));
            }
            if (random.nextInt(10) == 0) {
                title.append(ODD.get(random.nextInt(ODD.size())));
            }
            String brand = random.nextInt(5) == 0 ? ODD.get(random.nextInt(ODD.size())) : "w" + random.nextInt(40);
            rows.add(List.of(brand, Integer.toString(i + 1), title.toString()));
        }
        return rows;
    }

    private static List<Map<String, String>> items(List<List<String>> rows) {
        List<Map<String, String>> items = new ArrayList<>();
        for (List<String> row : rows) {
            Map<String, String> item = new LinkedHashMap<>();
            item.put("title", row.get(2));
            item.put("brand", row.get(0));
            items.add(item);
        }
        return items;
    }

    private Path csv(String name, List<List<String>> rows) throws IOException {
        CsvSchema.Builder schema = CsvSchema.builder();
        COLUMNS.forEach(schema::addColumn);
        Path file = dir.resolve(name);
        Files.writeString(file, new CsvMapper().writer(schema.build().withHeader()).writeValueAsString(rows), StandardCharsets.UTF_8);
        return file;
    }
}
