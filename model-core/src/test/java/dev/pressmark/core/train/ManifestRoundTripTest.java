package dev.pressmark.core.train;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.pressmark.core.Progress;
import dev.pressmark.core.bundle.Bundle;
import dev.pressmark.core.bundle.BundleArchive;
import dev.pressmark.core.bundle.HtmlReport;
import dev.pressmark.core.bundle.Manifest;
import dev.pressmark.core.drift.DriftProfile;
import dev.pressmark.core.evaluate.DuplicateCounts;
import java.io.ByteArrayInputStream;
import java.io.IOException;
import java.io.InputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.LinkedHashMap;
import java.util.Map;
import java.util.zip.ZipEntry;
import java.util.zip.ZipInputStream;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Every kind of manifest the project writes (the frozen format-1 bundle, and training's with one
 * view and several, a search, groups, a test file, case weights and each duplicates setting) read into {@link Manifest}
 * and written again gives back its {@code manifest.json} byte for byte; likewise each profile.
 */
class ManifestRoundTripTest {

    private static final Map<String, byte[]> BUNDLES = new LinkedHashMap<>();

    @BeforeAll
    static void trainEveryKind(@TempDir Path dir) throws IOException {
        try (InputStream in = ManifestRoundTripTest.class.getResourceAsStream("/bundles/format-1.pmb")) {
            BUNDLES.put("frozen-format-1", in.readAllBytes());
        }
        BUNDLES.putAll(ManifestFixtures.bundles(dir));
    }

    /** The bytes of {@code manifest.json} as the archive stores them. */
    private static byte[] manifestBytes(byte[] bundle) throws IOException {
        try (ZipInputStream zip = new ZipInputStream(new ByteArrayInputStream(bundle))) {
            ZipEntry first = zip.getNextEntry();
            assertThat(first.getName()).isEqualTo(BundleArchive.MANIFEST);
            return zip.readAllBytes();
        }
    }

    @Test
    void every_manifest_written_again_from_its_record_is_the_same_bytes() throws IOException {
        for (Map.Entry<String, byte[]> bundle : BUNDLES.entrySet()) {
            byte[] stored = manifestBytes(bundle.getValue());
            Manifest manifest = Manifest.parse(new String(stored, StandardCharsets.UTF_8));
            assertThat(manifest.toBytes()).as(bundle.getKey()).isEqualTo(stored);
        }
    }

    @Test
    void every_training_profile_written_again_from_its_record_is_the_same_tree() throws IOException {
        ObjectMapper json = new ObjectMapper();
        for (Map.Entry<String, byte[]> bundle : BUNDLES.entrySet()) {
            JsonNode stored = json.readTree(BundleArchive.read(bundle.getValue()).entry(BundleArchive.PROFILE));
            JsonNode again = json.readTree(json.writeValueAsString(DriftProfile.read(stored, bundle.getKey()).toJson()));
            assertThat(again).as(bundle.getKey()).isEqualTo(stored);
        }
    }

    @Test
    void the_kinds_cover_every_optional_part_of_a_manifest() {
        Map<String, Manifest> manifests = new LinkedHashMap<>();
        BUNDLES.forEach((name, bytes) -> manifests.put(name, Bundle.read(bytes).typedManifest()));
        assertThat(manifests.get("views-and-search").search()).isPresent();
        assertThat(manifests.get("views-and-search").listing().orElseThrow().formatVersion()).isEqualTo(2);
        assertThat(manifests.get("frozen-format-1").listing().orElseThrow().formatVersion()).isEqualTo(1);
        assertThat(manifests.get("logistic-two-labels").positiveLabel()).contains("plumbing");
        assertThat(manifests.get("logistic-two-labels").metrics().orElseThrow().testPerClass()).isEmpty();
        assertThat(manifests.get("svm-platt-three-labels").metrics().orElseThrow().testPerClass()).isPresent();
        assertThat(manifests.get("svm-platt-three-labels").classifier().orElseThrow().platt()).hasSize(3);
        Manifest.Training grouped = manifests.get("grouped").training().orElseThrow();
        assertThat(grouped.groups()).hasValue(40);
        assertThat(grouped.testFractionAchieved()).isPresent();
        Manifest.Training fromTestFile = manifests.get("grouped-test-file").training().orElseThrow();
        assertThat(fromTestFile.groups()).isPresent();
        assertThat(fromTestFile.testFractionAchieved()).isEmpty();
        assertThat(manifests.get("weighted").metrics().orElseThrow().testConfusion().orElseThrow().weights()).isPresent();
        assertThat(manifests.get("grouped").metrics().orElseThrow().testConfusion().orElseThrow().weights()).isEmpty();
        DuplicateCounts kept = manifests.get("logistic-two-labels").duplicates().orElseThrow();
        assertThat(kept.setting()).isEqualTo("keep");
        assertThat(kept.withinTrain().texts()).as("the listings repeat titles").isPositive();
        DuplicateCounts joined = manifests.get("duplicates-group").duplicates().orElseThrow();
        assertThat(joined.setting()).isEqualTo("group");
        assertThat(joined.acrossSplit()).isEqualTo(new DuplicateCounts.Tally(0, 0));
        assertThat(manifests.get("duplicates-group").training().orElseThrow().groups()).isPresent();
        DuplicateCounts dropped = manifests.get("duplicates-drop").duplicates().orElseThrow();
        assertThat(dropped.setting()).isEqualTo("drop");
        assertThat(dropped.droppedRows()).isPositive();
        assertThat(manifests.get("frozen-format-1").duplicates()).isEmpty();
    }

    @Test
    void the_bundle_training_returns_is_the_bundle_its_bytes_read_back_as(@TempDir Path dir) throws IOException {
        TrainPlan plan = TrainPlan.parse("""
                name: routing
                data: {file: %s, text: [title], label: department}
                tokenizer: {vocab_size: 120}
                features: {max_tokens: 200}
                classifier: {kind: linear-svm, probabilities: platt}
                evaluation: {folds: 3, threads: 1}
                """.formatted(dir.resolve("listings.csv").toString().replace("\\", "/")), "test");
        ManifestFixtures.writeListings(dir, 3);
        BundleTrainer.Trained built = BundleTrainer.train(plan, ManifestFixtures.CREATED, Progress.NONE);
        Bundle again = Bundle.read(built.bytes());
        assertThat(built.bundle().typedManifest()).isEqualTo(again.typedManifest());
        assertThat(built.bundle().manifest()).isEqualTo(again.manifest());
        assertThat(built.bundle().profile()).isEqualTo(again.profile());
        assertThat(built.bundle().predict(Map.of("title", "aquaflow valve kit")))
                .isEqualTo(again.predict(Map.of("title", "aquaflow valve kit")));
        assertThat(HtmlReport.render(built.bundle())).isEqualTo(HtmlReport.render(again));
    }
}
