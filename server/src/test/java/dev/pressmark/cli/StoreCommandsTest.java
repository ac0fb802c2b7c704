package dev.pressmark.cli;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.pressmark.core.bundle.BundleArchive;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.security.MessageDigest;
import java.sql.Connection;
import java.sql.DriverManager;
import java.sql.PreparedStatement;
import java.util.HexFormat;
import java.util.Map;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** The store commands as a user runs them: a child JVM in an empty directory, the default store. */
@Tag("slow") // a child JVM per command; over 10 s
class StoreCommandsTest {

    @TempDir
    Path dir;

    private Path bundle(String file, long seed) throws IOException {
        Path path = dir.resolve(file);
        Files.write(path, LoadableBundles.of(seed));
        return path;
    }

    private CommandRun run(String... args) {
        return CommandRun.run(dir, args);
    }

    @Test
    void the_store_comes_from_pressmark_store_when_no_store_option_is_given_and_the_option_wins_over_it() throws Exception {
        bundle("first.pmb", 1);
        Path elsewhere = Files.createDirectories(dir.resolve("elsewhere"));
        Map<String, String> env = Map.of("PRESSMARK_STORE", "sqlite:" + elsewhere.resolve("team.db"));
        byte[] none = new byte[0];
        CommandRun published = CommandRun.of(dir, env, none, "publish", "first.pmb", "--name", "routing", "--tag", "1.0.0", "--activate");
        assertThat(published.exitCode()).as(published.err()).isZero();
        assertThat(elsewhere.resolve("team.db")).exists();
        assertThat(dir.resolve("pressmark.db")).doesNotExist();

        CommandRun listed = CommandRun.of(dir, env, none, "versions", "routing");
        assertThat(listed.exitCode()).as(listed.err()).isZero();
        assertThat(listed.out()).containsPattern("\\* 1\\.0\\.0 ");
        // --store names another store: the default file, which has no such model
        CommandRun overridden = CommandRun.of(dir, env, none, "versions", "routing", "--store", "sqlite:" + dir.resolve("pressmark.db"));
        assertThat(overridden.exitCode()).isEqualTo(1);
        assertThat(overridden.err()).contains("routing");
        assertThat(dir.resolve("pressmark.db")).exists();
    }

    @Test
    void publish_activate_versions_rollback_and_history_work_in_an_empty_directory_with_no_set_up() throws Exception {
        Path first = bundle("first.pmb", 1);
        bundle("second.pmb", 2);
        CommandRun published = run("publish", "first.pmb", "--name", "routing", "--tag", "1.0.0", "--activate");
        assertThat(published.exitCode()).as(published.err()).isZero();
        assertThat(published.out()).contains("published routing 1.0.0").contains("activated routing 1.0.0");
        assertThat(dir.resolve("pressmark.db")).exists();
        assertThat(run("publish", "second.pmb", "--name", "routing", "--tag", "1.1.0").exitCode()).isZero();
        assertThat(run("activate", "routing", "1.1.0", "--reason", "better recall").exitCode()).isZero();

        CommandRun versions = run("versions", "routing", "--json");
        assertThat(versions.exitCode()).as(versions.err()).isZero();
        JsonNode json = new ObjectMapper().readTree(versions.out());
        assertThat(json.get("model").asText()).isEqualTo("routing");
        JsonNode list = json.get("versions");
        assertThat(list).hasSize(2);
        assertThat(list.get(0).get("tag").asText()).isEqualTo("1.1.0");
        assertThat(list.get(0).get("active").asBoolean()).isTrue();
        assertThat(list.get(1).get("active").asBoolean()).isFalse();
        assertThat(list.get(1).get("retired").asBoolean()).isFalse();
        // the JDK's SHA-256 of the file as written, computed outside the project
        String sha = HexFormat.of().formatHex(MessageDigest.getInstance("SHA-256").digest(Files.readAllBytes(first)));
        assertThat(list.get(1).get("sha256").asText()).isEqualTo(sha);
        assertThat(list.get(1).get("size").asLong()).isEqualTo(Files.size(first));
        assertThat(list.get(1).get("created_at").asText()).matches("\\d{4}-\\d\\d-\\d\\dT.*Z");

        CommandRun table = run("versions", "routing");
        assertThat(table.out()).containsPattern("\\* 1\\.1\\.0 ").containsPattern("\\n  1\\.0\\.0 ");

        CommandRun rollback = run("rollback", "routing");
        assertThat(rollback.exitCode()).isZero();
        assertThat(rollback.out()).isEqualTo("rolled back routing to 1.0.0\n");
        CommandRun again = run("rollback", "routing");
        assertThat(again.exitCode()).isEqualTo(1);
        assertThat(again.err()).startsWith("pressmark: cannot roll back routing: 1.0.0 is the start of its activation history");

        CommandRun history = run("history", "routing");
        assertThat(history.exitCode()).isZero();
        assertThat(history.out()).contains("better recall").contains("rollback from 1.1.0")
                .contains("by " + System.getProperty("user.name"));
    }

    @Test
    void a_tag_published_twice_is_refused_as_immutable() throws IOException {
        bundle("b.pmb", 1);
        assertThat(run("publish", "b.pmb", "--name", "routing", "--tag", "1").exitCode()).isZero();
        CommandRun twice = run("publish", "b.pmb", "--name", "routing", "--tag", "1");
        assertThat(twice.exitCode()).isEqualTo(1);
        assertThat(twice.err()).isEqualTo("pressmark: routing 1 is already published; a published tag is immutable, so publish under a new tag\n");
    }

    /** {@code bundle} with weights.bin's header claiming 2^31 - 1 features (int32 at offset 16, little-endian) and its checksums redone. */
    private static byte[] claimingMaxIntFeatures(byte[] bundle) {
        dev.pressmark.core.bundle.BundleContents contents = BundleArchive.read(bundle);
        byte[] weights = contents.entry(BundleArchive.WEIGHTS).clone();
        java.nio.ByteBuffer.wrap(weights).order(java.nio.ByteOrder.LITTLE_ENDIAN).putInt(16, Integer.MAX_VALUE);
        com.fasterxml.jackson.databind.node.ObjectNode manifest = contents.manifest().deepCopy();
        manifest.remove(BundleArchive.FORMAT_VERSION_FIELD);
        manifest.remove(BundleArchive.ENTRIES_FIELD);
        Map<String, byte[]> entries = new java.util.LinkedHashMap<>(contents.entries());
        entries.put(BundleArchive.WEIGHTS, weights);
        return BundleArchive.toBytes(manifest, entries);
    }

    @Test
    void a_bundle_that_does_not_load_is_not_published_one_line_exit_1_and_verify_names_one_stored_behind_the_stores_back() throws Exception {
        Files.write(dir.resolve("big.pmb"), claimingMaxIntFeatures(LoadableBundles.of(1)));
        CommandRun refused = run("publish", "big.pmb", "--name", "routing", "--tag", "1");
        assertThat(refused.exitCode()).isEqualTo(1);
        assertThat(refused.err()).isEqualTo("pressmark: big.pmb: cannot publish routing 1: weights.bin: the header declares 2,147,483,647 features,"
                + " more than 1,048,576, the limit on a model's features\n");
        bundle("good.pmb", 2);
        assertThat(run("publish", "good.pmb", "--name", "routing", "--tag", "1").exitCode()).isZero();
        // as a store written by an older program may hold it
        byte[] big = Files.readAllBytes(dir.resolve("big.pmb"));
        try (Connection c = DriverManager.getConnection("jdbc:sqlite:" + dir.resolve("pressmark.db"));
                PreparedStatement insert = c.prepareStatement("INSERT INTO versions (model, tag, sha256, size, created_at, manifest_json, bundle)"
                        + " VALUES ('routing', '2', ?, ?, 0, '{}', ?)")) {
            insert.setString(1, HexFormat.of().formatHex(MessageDigest.getInstance("SHA-256").digest(big)));
            insert.setLong(2, big.length);
            insert.setBytes(3, big);
            insert.executeUpdate();
        }
        CommandRun verified = run("verify");
        assertThat(verified.exitCode()).isEqualTo(1);
        assertThat(verified.out()).isEqualTo("UNUSABLE routing 2: weights.bin: the header declares 2,147,483,647 features, more than 1,048,576,"
                + " the limit on a model's features\n");
        assertThat(verified.err()).isEqualTo("pressmark: 1 of 2 versions do not load as a model\n");
    }

    @Test
    void verify_exits_1_listing_each_version_whose_bytes_changed() throws Exception {
        bundle("a.pmb", 1);
        bundle("b.pmb", 2);
        run("publish", "a.pmb", "--name", "routing", "--tag", "a");
        run("publish", "b.pmb", "--name", "risk", "--tag", "b");
        CommandRun clean = run("verify");
        assertThat(clean.exitCode()).isZero();
        assertThat(clean.out()).isEqualTo("verified 2 versions: every checksum matches and every version loads\n");

        byte[] altered = Files.readAllBytes(dir.resolve("b.pmb"));
        altered[altered.length - 30] ^= 0x01;
        try (Connection c = DriverManager.getConnection("jdbc:sqlite:" + dir.resolve("pressmark.db"));
                PreparedStatement update = c.prepareStatement("UPDATE versions SET bundle = ? WHERE model = 'risk'")) {
            update.setBytes(1, altered);
            assertThat(update.executeUpdate()).isEqualTo(1);
        }
        CommandRun dirty = run("verify");
        assertThat(dirty.exitCode()).isEqualTo(1);
        assertThat(dirty.out()).startsWith("MISMATCH risk b: SHA-256 ").doesNotContain("routing");
        assertThat(dirty.err()).isEqualTo("pressmark: 1 of 2 versions do not match their recorded SHA-256\n");
        assertThat(run("verify", "routing").exitCode()).isZero();
    }

    @Test
    void bad_input_gets_a_one_line_message_and_exit_1() throws IOException {
        bundle("b.pmb", 1);
        Files.writeString(dir.resolve("data.csv"), "title,label\n", StandardCharsets.UTF_8);

        CommandRun badName = run("publish", "b.pmb", "--name", "Routing", "--tag", "1");
        assertThat(badName.exitCode()).isEqualTo(1);
        assertThat(badName.err()).isEqualTo("pressmark: model name \"Routing\" must match [a-z0-9][a-z0-9-]{0,63}\n");

        CommandRun badTag = run("publish", "b.pmb", "--name", "routing", "--tag", "-1");
        assertThat(badTag.err()).isEqualTo("pressmark: tag \"-1\" must match [A-Za-z0-9][A-Za-z0-9._-]{0,63}\n");

        CommandRun notBundle = run("publish", "data.csv", "--name", "routing", "--tag", "1");
        assertThat(notBundle.exitCode()).isEqualTo(1);
        assertThat(notBundle.err()).isEqualTo("pressmark: data.csv: not a bundle: it does not start as a ZIP file\n");

        CommandRun missing = run("publish", "nope.pmb", "--name", "routing", "--tag", "1");
        assertThat(missing.err()).isEqualTo("pressmark: nope.pmb: no such file\n");

        CommandRun scheme = run("versions", "routing", "--store", "mysql://db/models");
        assertThat(scheme.exitCode()).isEqualTo(1);
        assertThat(scheme.err()).contains("unsupported store URL scheme \"mysql:\"; supported: sqlite:PATH, jdbc:sqlite:PATH, jdbc:postgresql://");

        CommandRun notStore = run("versions", "routing", "--store", "sqlite:data.csv");
        assertThat(notStore.err()).isEqualTo("pressmark: data.csv is not a pressmark store: it is not an SQLite database\n");

        CommandRun unknown = run("versions", "routing");
        assertThat(unknown.exitCode()).isEqualTo(1);
        assertThat(unknown.err()).isEqualTo("pressmark: no model routing in the store\n");

        assertThat(run("versions").exitCode()).isEqualTo(2);
    }

    @Test
    void an_explicit_store_path_is_created_on_first_use() throws IOException {
        bundle("b.pmb", 1);
        Path store = dir.resolve("team.db");
        assertThat(run("publish", "b.pmb", "--name", "routing", "--tag", "1", "--store", "sqlite:" + store).exitCode()).isZero();
        assertThat(store).exists();
        assertThat(dir.resolve("pressmark.db")).doesNotExist();
        assertThat(run("versions", "routing", "--store", "sqlite:" + store).out()).contains(" 1 ");
    }
}
