package dev.pressmark.spark;

import static org.assertj.core.api.Assertions.assertThat;

import dev.pressmark.core.bundle.Bundle;
import dev.pressmark.core.bundle.Prediction;
import dev.pressmark.store.BundleStore;
import dev.pressmark.store.jdbc.JdbcStores;
import dev.pressmark.store.Version;
import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.net.ServerSocket;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.sql.Connection;
import java.sql.DriverManager;
import java.sql.PreparedStatement;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.concurrent.atomic.AtomicInteger;
import org.apache.spark.sql.Encoders;
import org.apache.spark.sql.Row;
import org.apache.spark.sql.SparkSession;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * The spark-submit job on a real SQLite store in local mode: versions by tag and the active one,
 * Parquet and CSV, and the failures a user meets (a store that is down, a damaged version, a
 * missing column, an output that exists). Expected rows come from {@link Bundle#predict} on the
 * published bytes, which is what the HTTP service answers with.
 */
@Tag("slow")
class ScoreJobTest {

    @TempDir
    static Path dir;
    private static SparkSession spark;
    private static String storeUrl;
    private static byte[] subwords;
    private static byte[] words;
    private static Version v1;
    private static List<String> titles;

    @BeforeAll
    static void start() {
        spark = LocalSpark.start(dir.resolve("warehouse"));
        subwords = TrainedBundles.subwords(dir);
        words = TrainedBundles.wordsWithoutProbabilities(dir);
        storeUrl = "sqlite:" + dir.resolve("store.db");
        try (BundleStore store = JdbcStores.open(storeUrl)) {
            v1 = store.publish("routing", "v1", subwords, "test");
            store.publish("routing", "v2", words, "test");
            store.activate("routing", "v2", "test", "the test's active version");
            store.publish("damaged", "v1", subwords, "test");
        }
        titles = TrainedBundles.unseenTitles(1_000);
        spark.createDataset(titles, Encoders.STRING()).toDF("title").repartition(4).write().parquet(dir.resolve("titles.parquet").toString());
    }

    @AfterAll
    static void stop() {
        spark.stop();
    }

    private static String run(String... args) {
        ByteArrayOutputStream err = new ByteArrayOutputStream();
        int code = ScoreJob.run(spark, ScoreOptions.parse(args, null), new PrintStream(err, true, StandardCharsets.UTF_8));
        return code + " " + err.toString(StandardCharsets.UTF_8).strip();
    }

    private static List<Prediction> expected(byte[] bundle, List<String> texts) {
        List<Map<String, String>> items = new ArrayList<>();
        texts.forEach(text -> items.add(Map.of("title", text)));
        return Bundle.read(bundle).predict(items, PressmarkScorer.DEFAULT_MAX_TOKENS_PER_FIELD);
    }

    @Test
    void a_tagged_version_scores_a_parquet_table_into_a_parquet_table_as_bundle_predict_does() {
        String out = dir.resolve("v1.parquet").toString();

        assertThat(run("--model", "routing:v1", "--store", storeUrl, "--input", dir.resolve("titles.parquet").toString(),
                "--output", out)).isEqualTo("0 ");

        List<Row> rows = spark.read().parquet(out).collectAsList();
        List<String> texts = rows.stream().map(row -> row.getString(0)).toList();
        List<Prediction> expected = expected(subwords, texts);
        assertThat(texts).containsExactlyInAnyOrderElementsOf(titles);
        for (int i = 0; i < rows.size(); i++) {
            Row p = rows.get(i).getStruct(1);
            assertThat(p.getString(0)).isEqualTo(expected.get(i).label());
            assertThat(p.getDouble(1)).isEqualTo(expected.get(i).score());
            assertThat(p.getJavaMap(2)).isEqualTo(expected.get(i).probabilities());
            assertThat(p.getString(3)).isEqualTo("v1");
        }
    }

    @Test
    void the_shipped_bytes_of_a_stored_version_are_the_published_bytes() {
        try (PressmarkScorer scorer = PressmarkScorer.create(spark, BundleSource.store(storeUrl, "routing:v1"))) {
            assertThat(scorer.sha256()).isEqualTo(v1.sha256());
            assertThat(scorer.version()).isEqualTo("v1");
        }
    }

    @Test
    void without_a_tag_the_active_version_scores_and_csv_output_has_flat_columns() throws Exception {
        Path csvIn = dir.resolve("titles-csv");
        spark.read().parquet(dir.resolve("titles.parquet").toString()).coalesce(1).write().option("header", "true").csv(csvIn.toString());
        Path out = dir.resolve("active-csv");

        assertThat(run("--model", "routing", "--store", storeUrl, "--input", csvIn.toString(), "--output", out.toString(),
                "--format", "csv")).isEqualTo("0 ");

        Row first = spark.read().option("header", "true").csv(out.toString()).first();
        assertThat(first.schema().fieldNames()).containsExactly("title", "label", "score", "version");
        Prediction expected = expected(words, List.of(first.getString(0))).get(0);
        assertThat(first.getString(1)).isEqualTo(expected.label());
        assertThat(Double.parseDouble(first.getString(2))).isEqualTo(expected.score());
        assertThat(first.getString(3)).isEqualTo("v2");
    }

    @Test
    void csv_output_of_a_model_with_probabilities_has_one_column_per_label() {
        Path out = dir.resolve("v1-csv");
        Path in = dir.resolve("v1-csv-in");
        spark.createDataset(List.of("Vortaline pipe elbow 1/2in"), Encoders.STRING()).toDF("title").write().option("header", "true")
                .csv(in.toString());

        assertThat(run("--model", "routing:v1", "--store", storeUrl, "--input", in.toString(), "--output", out.toString(),
                "--format", "csv")).isEqualTo("0 ");

        Row row = spark.read().option("header", "true").csv(out.toString()).first();
        Prediction expected = expected(subwords, List.of("Vortaline pipe elbow 1/2in")).get(0);
        List<String> columns = new ArrayList<>(List.of("title", "label", "score"));
        expected.probabilities().keySet().forEach(label -> columns.add("p:" + label));
        columns.add("version");
        assertThat(row.schema().fieldNames()).containsExactlyElementsOf(columns);
        for (Map.Entry<String, Double> p : expected.probabilities().entrySet()) {
            assertThat(Double.parseDouble(row.getString(row.fieldIndex("p:" + p.getKey())))).isEqualTo(p.getValue());
        }
    }

    @Test
    void a_store_that_is_down_is_a_one_line_error_naming_it_and_no_task_runs() throws Exception {
        int port;
        try (ServerSocket socket = new ServerSocket(0)) {
            port = socket.getLocalPort();
        }
        AtomicInteger tasks = LocalSpark.countTasks(spark);

        String answer = run("--model", "routing:v1", "--store", "jdbc:postgresql://127.0.0.1:" + port + "/pressmark?user=x&password=y",
                "--input", dir.resolve("titles.parquet").toString(), "--output", dir.resolve("down").toString());

        assertThat(answer).startsWith("1 pressmark score: routing:v1: cannot connect to PostgreSQL at 127.0.0.1:" + port + "/pressmark").doesNotContain("password").doesNotContain("\n");
        assertThat(Files.exists(dir.resolve("down"))).isFalse();
        spark.range(1).coalesce(1).count();
        Thread.sleep(500);
        assertThat(tasks.get()).isEqualTo(1);
    }

    @Test
    void a_version_whose_stored_bytes_no_longer_match_their_checksum_is_refused() throws Exception {
        // the same damage the store's own contract tests make: one byte of the stored bundle flipped
        try (Connection c = DriverManager.getConnection("jdbc:sqlite:" + dir.resolve("store.db"));
                PreparedStatement update = c.prepareStatement("UPDATE versions SET bundle = ? WHERE model = 'damaged'")) {
            byte[] bytes = subwords.clone();
            bytes[bytes.length / 3] ^= 0x01;
            update.setBytes(1, bytes);
            assertThat(update.executeUpdate()).isEqualTo(1);
        }

        String answer = run("--model", "damaged:v1", "--store", storeUrl, "--input", dir.resolve("titles.parquet").toString(),
                "--output", dir.resolve("damaged").toString());

        assertThat(answer).startsWith("1 pressmark score: damaged:v1 in ").contains("damaged");
        assertThat(Files.exists(dir.resolve("damaged"))).isFalse();
    }

    @Test
    void a_table_without_the_input_column_is_refused_naming_it_and_a_mapping_fixes_it() {
        Path in = dir.resolve("names.parquet");
        spark.createDataset(List.of("Vortaline pipe elbow 1/2in"), Encoders.STRING()).toDF("name").write().parquet(in.toString());

        assertThat(run("--model", "routing:v1", "--store", storeUrl, "--input", in.toString(), "--output", dir.resolve("x").toString()))
                .startsWith("1 pressmark score: the DataFrame has no column \"title\" for the bundle's input field \"title\"");
        assertThat(run("--model", "routing:v1", "--store", storeUrl, "--input", in.toString(), "--output", dir.resolve("y").toString(),
                "--column", "title=name")).isEqualTo("0 ");
    }

    @Test
    void an_output_that_exists_is_refused_and_left_as_it_was() throws Exception {
        Path out = Files.createDirectories(dir.resolve("exists"));
        Files.writeString(out.resolve("keep.txt"), "mine");

        assertThat(run("--model", "routing:v1", "--store", storeUrl, "--input", dir.resolve("titles.parquet").toString(),
                "--output", out.toString())).isEqualTo("1 pressmark score: --output " + out + " exists; give a path that does not"
                + " (nothing was written)");
        assertThat(Files.readString(out.resolve("keep.txt"))).isEqualTo("mine");
    }
}
