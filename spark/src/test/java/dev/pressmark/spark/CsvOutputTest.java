package dev.pressmark.spark;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.databind.MappingIterator;
import com.fasterxml.jackson.dataformat.csv.CsvMapper;
import com.fasterxml.jackson.dataformat.csv.CsvParser;
import dev.pressmark.core.bundle.Bundle;
import dev.pressmark.core.bundle.Prediction;
import dev.pressmark.store.BundleStore;
import dev.pressmark.store.jdbc.JdbcStores;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.PrintStream;
import java.math.BigDecimal;
import java.math.MathContext;
import java.math.RoundingMode;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.stream.Stream;
import org.apache.spark.sql.SparkSession;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * The job's CSV output read back with an RFC 4180 reader (Jackson's CSV parser, as
 * {@code pressmark predict --data}'s files are read): quoted labels and texts come back whole, and
 * every number is the shortest decimal that reads back as the bundle's double, which is what
 * {@code predict --data} writes. Expected values come from {@link Bundle#predict} on the
 * published bytes.
 */
@Tag("slow")
class CsvOutputTest {

    /** Labels that a CSV file must quote: separators and quotes (training trims the spaces around a label). */
    private static final Map<String, String> AWKWARD_LABELS = Map.of("plumbing", "pipes, \"wet\" work", "garden", "garden,outdoor");

    @TempDir
    static Path dir;
    private static SparkSession spark;
    private static String storeUrl;
    private static byte[] subwords;
    private static byte[] awkward;

    @BeforeAll
    static void start() {
        spark = LocalSpark.start(dir.resolve("warehouse"));
        subwords = TrainedBundles.subwords(dir);
        awkward = TrainedBundles.subwordsWithLabels(dir, AWKWARD_LABELS);
        storeUrl = "sqlite:" + dir.resolve("store.db");
        try (BundleStore store = JdbcStores.open(storeUrl)) {
            store.publish("routing", "v1", subwords, "test");
            store.publish("awkward", "v1", awkward, "test");
        }
    }

    @AfterAll
    static void stop() {
        spark.stop();
    }

    @Test
    void every_number_is_the_shortest_decimal_that_reads_back_as_the_bundles_double() throws IOException {
        List<String> titles = TrainedBundles.unseenTitles(1_000);
        Table out = score("routing:v1", "numbers", titles);

        Bundle bundle = Bundle.read(subwords);
        assertThat(out.rows()).hasSize(titles.size());
        for (List<String> row : out.rows()) {
            Prediction expected = bundle.predict(List.of(Map.of("title", row.get(0))), PressmarkScorer.DEFAULT_MAX_TOKENS_PER_FIELD).get(0);
            assertThat(row.get(1)).isEqualTo(expected.label());
            assertShortestOf(row.get(2), expected.score());
            for (int l = 0; l < bundle.labels().size(); l++) {
                assertShortestOf(row.get(3 + l), expected.probabilities().get(bundle.labels().get(l)));
            }
            assertThat(row.get(row.size() - 1)).isEqualTo("v1");
        }
    }

    @Test
    void labels_that_need_quoting_come_back_whole_in_the_header_and_the_cells() throws IOException {
        List<String> titles = TrainedBundles.unseenTitles(300);
        Table out = score("awkward:v1", "awkward", titles);

        Bundle bundle = Bundle.read(awkward);
        List<String> header = new ArrayList<>(List.of("title", "label", "score"));
        bundle.labels().forEach(label -> header.add("p:" + label));
        header.add("version");
        assertThat(out.header()).containsExactlyElementsOf(header).contains("p:pipes, \"wet\" work", "p:garden,outdoor");
        List<String> labels = new ArrayList<>();
        for (List<String> row : out.rows()) {
            Prediction expected = bundle.predict(List.of(Map.of("title", row.get(0))), PressmarkScorer.DEFAULT_MAX_TOKENS_PER_FIELD).get(0);
            assertThat(row.get(1)).isEqualTo(expected.label());
            assertThat(Double.parseDouble(row.get(2))).isEqualTo(expected.score());
            labels.add(row.get(1));
        }
        assertThat(labels).contains("pipes, \"wet\" work", "garden,outdoor");
    }

    @Test
    void input_texts_with_quotes_separators_and_outer_spaces_are_scored_and_carried_through_as_written() throws IOException {
        List<String> titles = List.of("Quorubwick \"pro\" service kit, 3/4in", "  Vortaline pipe elbow 1/2in ", "plain hex bolt");
        Table out = score("routing:v1", "quoted", titles);

        Bundle bundle = Bundle.read(subwords);
        assertThat(out.rows()).extracting(row -> row.get(0)).containsExactlyInAnyOrderElementsOf(titles);
        for (List<String> row : out.rows()) {
            Prediction expected = bundle.predict(List.of(Map.of("title", row.get(0))), PressmarkScorer.DEFAULT_MAX_TOKENS_PER_FIELD).get(0);
            assertThat(row.get(1)).as(row.get(0)).isEqualTo(expected.label());
            assertThat(Double.parseDouble(row.get(2))).as(row.get(0)).isEqualTo(expected.score());
        }
    }

    @Test
    void a_table_without_rows_gives_a_file_with_the_header_alone() throws IOException {
        Table out = score("routing:v1", "empty", List.of());

        List<String> header = new ArrayList<>(List.of("title", "label", "score"));
        Bundle.read(subwords).labels().forEach(label -> header.add("p:" + label));
        header.add("version");
        assertThat(out.header()).containsExactlyElementsOf(header);
        assertThat(out.rows()).isEmpty();
    }

    /**
     * {@code cell} reads back as exactly {@code value}, and no decimal with fewer significant digits
     * does: the nearest decimal of each shorter length is tried (the decimals that read back as
     * {@code value} form an interval around it, so if any of a length does, the nearest does). The
     * property is the one Steele and White's and Giulietti's (Schubfach) shortest-digit writers
     * guarantee.
     */
    private static void assertShortestOf(String cell, double value) {
        assertThat(Double.parseDouble(cell)).as(cell).isEqualTo(value);
        int digits = new BigDecimal(cell).stripTrailingZeros().precision();
        BigDecimal exact = new BigDecimal(value);
        for (int d = 1; d < digits; d++) {
            double shorter = exact.round(new MathContext(d, RoundingMode.HALF_EVEN)).doubleValue();
            assertThat(shorter).as("%s has %d significant digits, but %d read back as the same double", cell, digits, d).isNotEqualTo(value);
        }
    }

    private record Table(List<String> header, List<List<String>> rows) {
    }

    /** Runs the job on a one-column CSV of {@code titles} (RFC 4180) and reads every part of its CSV output. */
    private static Table score(String model, String name, List<String> titles) throws IOException {
        Path in = Files.createDirectories(dir.resolve(name + "-in"));
        StringBuilder csv = new StringBuilder("title\n");
        titles.forEach(title -> csv.append(TrainedBundles.quoted(title)).append('\n'));
        Files.writeString(in.resolve("titles.csv"), csv, StandardCharsets.UTF_8);
        Path out = dir.resolve(name + "-out");
        ByteArrayOutputStream err = new ByteArrayOutputStream();
        String[] args = {"--model", model, "--store", storeUrl, "--input", in.toString(), "--output", out.toString(), "--format", "csv"};

        int code = ScoreJob.run(spark, ScoreOptions.parse(args, null), new PrintStream(err, true, StandardCharsets.UTF_8));

        assertThat(code).as(err.toString(StandardCharsets.UTF_8)).isZero();
        return read(out);
    }

    private static Table read(Path out) throws IOException {
        List<String> header = null;
        List<List<String>> rows = new ArrayList<>();
        List<Path> parts;
        try (Stream<Path> files = Files.list(out)) {
            parts = files.filter(file -> file.getFileName().toString().startsWith("part-")).sorted().toList();
        }
        assertThat(parts).isNotEmpty().allSatisfy(part -> assertThat(part.getFileName().toString()).endsWith(".csv"));
        CsvMapper csv = new CsvMapper().enable(CsvParser.Feature.WRAP_AS_ARRAY);
        for (Path part : parts) {
            try (MappingIterator<List<String>> lines = csv.readerForListOf(String.class).readValues(part.toFile())) {
                List<List<String>> all = lines.readAll();
                if (all.isEmpty()) {
                    continue;
                }
                if (header == null) {
                    header = all.get(0);
                }
                assertThat(all.get(0)).as(part.toString()).isEqualTo(header);
                rows.addAll(all.subList(1, all.size()));
            }
        }
        return new Table(header, rows);
    }
}
