package dev.pressmark.spark;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import dev.pressmark.core.bundle.Bundle;
import dev.pressmark.core.bundle.Prediction;
import dev.pressmark.core.bundle.Sha256;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.concurrent.atomic.AtomicInteger;
import org.apache.spark.sql.Dataset;
import org.apache.spark.sql.Encoders;
import org.apache.spark.sql.Row;
import org.apache.spark.sql.SparkSession;
import org.apache.spark.sql.functions;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Scoring DataFrames in local mode against {@link Bundle#predict} in process. The HTTP service's
 * predict endpoint answers with that same call on the same bundle bytes, and the server's
 * {@code AnswerEncodingTest} checks that every double of its answer reads back to the bundle's own
 * value exactly; so equal here means equal to {@code POST /models/{name}/predict}: same labels,
 * and scores and probabilities equal bit for bit (compared with {@code Double.equals}, no tolerance).
 * This module does not depend on the server, so it does not start one.
 */
@Tag("slow")
class PressmarkScorerTest {

    @TempDir
    static Path dir;
    private static SparkSession spark;
    private static Path subwords;
    private static Path words;

    @BeforeAll
    static void start() throws Exception {
        spark = LocalSpark.start(dir.resolve("warehouse"));
        subwords = Files.write(dir.resolve("subwords.pmb"), TrainedBundles.subwords(dir));
        words = Files.write(dir.resolve("words.pmb"), TrainedBundles.wordsWithoutProbabilities(dir));
    }

    @AfterAll
    static void stop() {
        spark.stop();
    }

    private static Dataset<Row> titles(List<String> titles, int partitions) {
        return spark.createDataset(titles, Encoders.STRING()).toDF("title").repartition(partitions);
    }

    private static void assertScoredAsInProcess(Path bundleFile, List<Row> rows, String column, String version) {
        Bundle bundle = Bundle.read(bundleFile);
        List<Map<String, String>> items = new ArrayList<>();
        rows.forEach(row -> items.add(Map.of("title", row.getString(row.fieldIndex("title")))));
        List<Prediction> expected = bundle.predict(items, PressmarkScorer.DEFAULT_MAX_TOKENS_PER_FIELD);
        for (int i = 0; i < rows.size(); i++) {
            Row p = rows.get(i).getStruct(rows.get(i).fieldIndex(column));
            String where = "row " + i + " \"" + items.get(i).get("title") + "\"";
            assertThat(p.getString(0)).as(where).isEqualTo(expected.get(i).label());
            assertThat(p.getDouble(1)).as(where).isEqualTo(expected.get(i).score());
            assertThat(p.isNullAt(2) ? null : p.getJavaMap(2)).as(where).isEqualTo(expected.get(i).probabilities());
            assertThat(p.getString(3)).as(where).isEqualTo(version);
        }
    }

    @Test
    void every_row_gets_the_label_score_and_probabilities_that_bundle_predict_gives() {
        try (PressmarkScorer scorer = PressmarkScorer.create(spark, BundleSource.file(subwords))) {
            List<Row> rows = scorer.score(titles(TrainedBundles.unseenTitles(2_000), 8)).collectAsList();

            assertThat(rows).hasSize(2_000);
            assertScoredAsInProcess(subwords, rows, PredictionColumn.DEFAULT_NAME, scorer.version());
            assertThat(scorer.version()).isEqualTo("sha256:" + Sha256.hex(readAll(subwords)));
            assertThat(rows.get(0).getStruct(1).getJavaMap(2)).hasSize(Bundle.read(subwords).labels().size());
        }
    }

    @Test
    void partitions_longer_than_a_batch_with_null_texts_among_them_score_as_bundle_predict_does() {
        int rows = 2 * PartitionScorer.BATCH_ROWS + 300;
        try (PressmarkScorer scorer = PressmarkScorer.create(spark, BundleSource.file(subwords))) {
            List<String> titles = new ArrayList<>(TrainedBundles.unseenTitles(rows));
            for (int i = 0; i < titles.size(); i += 97) {
                titles.set(i, null);
            }
            Dataset<Row> frame = spark.createDataset(titles, Encoders.STRING()).toDF("title").coalesce(1);

            List<Row> scored = scorer.score(frame).collectAsList();

            assertThat(scored).hasSize(rows);
            List<Row> present = new ArrayList<>();
            for (int i = 0; i < rows; i++) {
                assertThat(scored.get(i).getString(0)).isEqualTo(titles.get(i));
                assertThat(scored.get(i).isNullAt(1)).as("row %d", i).isEqualTo(titles.get(i) == null);
                if (titles.get(i) != null) {
                    present.add(scored.get(i));
                }
            }
            assertScoredAsInProcess(subwords, present, PredictionColumn.DEFAULT_NAME, scorer.version());
        }
    }

    @Test
    void a_model_without_probabilities_gives_a_null_map_and_the_same_labels_and_scores() {
        try (PressmarkScorer scorer = PressmarkScorer.create(spark, BundleSource.file(words))) {
            List<Row> rows = scorer.score(titles(TrainedBundles.unseenTitles(500), 3), "p").collectAsList();

            assertScoredAsInProcess(words, rows, "p", scorer.version());
            assertThat(rows).allSatisfy(row -> assertThat(row.getStruct(1).isNullAt(2)).isTrue());
        }
    }

    @Test
    void the_bundle_is_loaded_once_in_this_jvm_however_many_tasks_and_actions_use_it() {
        BundleCache.forgetAll();
        try (PressmarkScorer scorer = PressmarkScorer.create(spark, BundleSource.file(subwords))) {
            long before = BundleCache.loads();
            AtomicInteger tasks = LocalSpark.countTasks(spark);
            Dataset<Row> scored = scorer.score(titles(TrainedBundles.unseenTitles(400), 8));

            scored.select("prediction.label").collectAsList();
            scored.select("prediction.score").collectAsList();

            awaitAtLeast(tasks, 16);
            assertThat(BundleCache.loads() - before).isEqualTo(1);
        }
    }

    @Test
    void the_sql_function_answers_as_the_dataframe_api() {
        try (PressmarkScorer scorer = PressmarkScorer.create(spark, BundleSource.file(subwords))) {
            scorer.register();
            titles(TrainedBundles.unseenTitles(300), 2).createOrReplaceTempView("listings");

            List<Row> rows = spark.sql("SELECT title, pressmark_predict(title) AS prediction FROM listings").collectAsList();

            assertScoredAsInProcess(subwords, rows, "prediction", scorer.version());
            Row one = spark.sql("SELECT pressmark_predict('Quorubwick service kit 3/4in').label").first();
            assertThat(one.getString(0)).isEqualTo(Bundle.read(subwords)
                    .predict(List.of(Map.of("title", "Quorubwick service kit 3/4in"))).get(0).label());
        }
    }

    @Test
    void a_mapped_column_is_scored_as_the_input_field_it_stands_for() {
        try (PressmarkScorer scorer = PressmarkScorer.create(spark, BundleSource.file(subwords)).withColumn("title", "product name")) {
            Dataset<Row> frame = titles(TrainedBundles.unseenTitles(200), 2).withColumnRenamed("title", "product name");

            List<Row> rows = scorer.score(frame).withColumn("title", functions.col("`product name`")).collectAsList();

            assertScoredAsInProcess(subwords, rows, "prediction", scorer.version());
        }
    }

    @Test
    void a_null_text_gives_a_null_prediction_and_the_other_rows_are_scored() {
        try (PressmarkScorer scorer = PressmarkScorer.create(spark, BundleSource.file(subwords))) {
            Dataset<Row> frame = spark.sql("SELECT CAST(NULL AS STRING) AS title UNION ALL SELECT 'Vortaline pipe elbow 1/2in'");

            List<Row> rows = scorer.score(frame).orderBy(functions.col("title").asc_nulls_first()).collectAsList();

            assertThat(rows.get(0).isNullAt(1)).isTrue();
            assertThat(rows.get(1).getStruct(1).getString(0)).isEqualTo(Bundle.read(subwords)
                    .predict(List.of(Map.of("title", "Vortaline pipe elbow 1/2in"))).get(0).label());
        }
    }

    @Test
    void a_dataframe_without_the_input_column_is_refused_naming_it_and_the_columns_it_has() {
        try (PressmarkScorer scorer = PressmarkScorer.create(spark, BundleSource.file(subwords))) {
            Dataset<Row> frame = titles(List.of("a"), 1).withColumnRenamed("title", "name");

            assertThatThrownBy(() -> scorer.score(frame))
                    .isInstanceOf(SparkScoringException.class)
                    .hasMessageContaining("no column \"title\"")
                    .hasMessageContaining("input field \"title\"")
                    .hasMessageContaining("its columns are name")
                    .extracting(e -> ((SparkScoringException) e).code()).isEqualTo(SparkScoringException.MISSING_COLUMN);
            assertThatThrownBy(() -> scorer.withColumn("title", "label").score(frame))
                    .hasMessageContaining("no column \"label\" (mapped to the bundle's input field \"title\")");
            assertThatThrownBy(() -> scorer.withColumn("brand", "name"))
                    .hasMessageContaining("\"brand\" is not an input field of the bundle; its fields are [title]");
        }
    }

    @Test
    void a_column_that_does_not_hold_text_is_refused_naming_its_type() {
        try (PressmarkScorer scorer = PressmarkScorer.create(spark, BundleSource.file(subwords))) {
            Dataset<Row> frame = spark.range(3).toDF("title");

            assertThatThrownBy(() -> scorer.score(frame))
                    .isInstanceOf(SparkScoringException.class)
                    .hasMessage("column \"title\" is bigint, not string; cast it to string to score it");
        }
    }

    @Test
    void a_bundle_file_whose_sha256_is_not_the_expected_one_is_refused_before_any_task_runs() throws Exception {
        Path bundle = copy(subwords, "expected.pmb");
        String published = Sha256.hex(readAll(bundle));
        byte[] other = TrainedBundles.wordsWithoutProbabilities(dir);
        Files.write(bundle, other);
        AtomicInteger tasks = LocalSpark.countTasks(spark);

        assertThatThrownBy(() -> PressmarkScorer.create(spark, BundleSource.file(bundle, published)).score(titles(List.of("a"), 1)))
                .isInstanceOf(SparkScoringException.class)
                .hasMessage(bundle + ": SHA-256 is " + Sha256.hex(other) + ", expected " + published + "; refusing to score with it");

        assertNoTaskRanBeforeTheNextJob(tasks);
    }

    @Test
    void a_damaged_bundle_file_is_refused_by_its_entry_checksums_before_any_task_runs() throws Exception {
        byte[] bytes = readAll(subwords);
        bytes[bytes.length / 2] ^= 0x01;
        Path damaged = Files.write(dir.resolve("damaged.pmb"), bytes);
        AtomicInteger tasks = LocalSpark.countTasks(spark);

        assertThatThrownBy(() -> PressmarkScorer.create(spark, BundleSource.file(damaged)))
                .hasMessageStartingWith(damaged.toString());

        assertNoTaskRanBeforeTheNextJob(tasks);
    }

    /** Listener events arrive in order: after one job of one task, a count of exactly one means nothing ran before it. */
    private static void assertNoTaskRanBeforeTheNextJob(AtomicInteger tasks) {
        spark.range(1).coalesce(1).count();
        awaitAtLeast(tasks, 1);
        assertThat(tasks.get()).isEqualTo(1);
    }

    private static void awaitAtLeast(AtomicInteger counter, int count) {
        long deadline = System.nanoTime() + 10_000_000_000L;
        while (counter.get() < count && System.nanoTime() < deadline) {
            try {
                Thread.sleep(10);
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
                throw new AssertionError("interrupted while waiting for Spark's task events", e);
            }
        }
        assertThat(counter.get()).isGreaterThanOrEqualTo(count);
    }

    private static Path copy(Path file, String name) {
        try {
            return Files.copy(file, dir.resolve(name), java.nio.file.StandardCopyOption.REPLACE_EXISTING);
        } catch (java.io.IOException e) {
            throw new java.io.UncheckedIOException(e);
        }
    }

    private static byte[] readAll(Path file) {
        try {
            return Files.readAllBytes(file);
        } catch (java.io.IOException e) {
            throw new java.io.UncheckedIOException(e);
        }
    }
}
