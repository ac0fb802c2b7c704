package dev.pressmark.core.drift;

import static org.assertj.core.api.Assertions.assertThat;

import dev.pressmark.core.Progress;
import dev.pressmark.core.bundle.Bundle;
import dev.pressmark.core.train.BundleAssembler;
import dev.pressmark.core.train.LabelledData;
import dev.pressmark.core.train.TrainConfig;
import dev.pressmark.core.train.TrainingRun;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.SplittableRandom;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** A real bundle against its own training rows, and against text it has never seen. */
class DriftOnTrainingRowsTest {

    @TempDir
    static Path dir;

    private static Bundle bundle;
    private static List<Map<String, String>> trainingItems;

    /** Invented listing titles: three departments whose brand syllables carry the signal. */
    @BeforeAll
    static void train() throws IOException {
        String[][] parts = {
            {"aqua", "flow", "valve", "pipe", "drain"},
            {"volt", "amp", "switch", "outlet", "breaker"},
            {"fern", "leaf", "hose", "rake", "planter"},
        };
        String[] labels = {"plumbing", "electrical", "garden"};
        SplittableRandom random = new SplittableRandom(11);
        StringBuilder csv = new StringBuilder("title,department\n");
        for (int i = 0; i < 400; i++) {
            int k = random.nextInt(3);
            csv.append(parts[k][random.nextInt(2)]).append(parts[random.nextInt(3)][random.nextInt(2)]).append(' ')
                    .append(parts[k][2 + random.nextInt(3)]).append(" pack of ").append(1 + random.nextInt(12)).append(',')
                    .append(labels[k]).append('\n');
        }
        Files.writeString(dir.resolve("listings.csv"), csv);
        Path yaml = dir.resolve("train.yaml");
        Files.writeString(yaml, """
                name: routing
                data: {file: listings.csv, text: [title], label: department}
                tokenizer: {vocab_size: 120}
                features: {max_tokens: 300}
                evaluation: {folds: 3, threads: 1}
                """);
        TrainConfig config = TrainConfig.read(yaml);
        LabelledData data = LabelledData.read(dir.resolve("listings.csv"), config.data().text(), config.data().label(), false);
        TrainingRun.Result result = new TrainingRun(config, data).run(Progress.NONE);
        bundle = Bundle.read(BundleAssembler.assemble(config, data, result, Instant.parse("2026-01-01T00:00:00Z")));
        trainingItems = new ArrayList<>();
        for (int row : result.trainRows()) {
            trainingItems.add(Map.of("title", data.texts().get(row)[0]));
        }
    }

    @Test
    void the_training_rows_themselves_show_no_drift_and_the_profiles_unknown_rate() {
        DriftMonitor monitor = new DriftMonitor(bundle, trainingItems.size());
        monitor.observe(trainingItems);
        DriftReport report = monitor.report();
        DriftProfile profile = DriftProfile.of(bundle);
        assertThat(profile.documentFrequencyTotal()).isPresent();
        assertThat(report.windowItems()).isEqualTo(profile.rows());
        // Same rows, same tokeniser, same counts: every bin's share is identical, so every term is exactly zero.
        assertThat(report.psi()).isEqualTo(0.0);
        assertThat(report.liveUnknownRate()).isEqualTo(profile.unknownRate());
        assertThat(report.length().live()).isEqualTo(profile.tokensPerRow());
        assertThat(report.status()).isEqualTo(DriftStatus.OK);
    }

    @Test
    void text_of_unseen_words_and_letters_drifts() {
        DriftMonitor monitor = new DriftMonitor(bundle, 500);
        List<Map<String, String>> unseen = new ArrayList<>();
        for (int i = 0; i < 200; i++) {
            unseen.add(Map.of("title", "ζωή κόσμος " + i + " ΔΕΛΤΑ шкаф"));
        }
        monitor.observe(unseen);
        DriftReport report = monitor.report();
        assertThat(report.liveUnknownRate()).isGreaterThan(report.trainingUnknownRate() + 0.3);
        assertThat(report.psi()).isGreaterThan(DriftStatus.DRIFT_ABOVE);
        assertThat(report.status()).isEqualTo(DriftStatus.DRIFT);
    }
}
