package dev.pressmark.server;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.databind.node.JsonNodeFactory;
import com.fasterxml.jackson.databind.node.ObjectNode;
import dev.pressmark.core.bundle.BundleArchive;
import dev.pressmark.core.bundle.BundleContents;
import dev.pressmark.core.bundle.BundleLimits;
import dev.pressmark.store.BundleStore;
import java.lang.reflect.InvocationTargetException;
import java.lang.reflect.Proxy;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.channels.FileChannel;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.sql.Connection;
import java.sql.DriverManager;
import java.sql.ResultSet;
import java.sql.Statement;
import java.util.LinkedHashMap;
import java.util.Map;
import java.util.concurrent.atomic.AtomicBoolean;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** Publishing checks that a bundle loads, activation loads it here and compares-and-sets, readiness reads the store. */
class BundleLifecycleTest {

    @TempDir
    Path dir;

    private static byte[] utf8(String text) {
        return text.getBytes(StandardCharsets.UTF_8);
    }

    /** {@code bundle} with one entry replaced and every checksum made to match again. */
    private static byte[] rewritten(byte[] bundle, String entry, byte[] bytes) {
        BundleContents contents = BundleArchive.read(bundle);
        ObjectNode manifest = contents.manifest().deepCopy();
        manifest.remove(BundleArchive.FORMAT_VERSION_FIELD);
        manifest.remove(BundleArchive.ENTRIES_FIELD);
        Map<String, byte[]> entries = new LinkedHashMap<>(contents.entries());
        entries.put(entry, bytes);
        return BundleArchive.toBytes(manifest, entries);
    }

    private static Http.Answer put(Served s, String tag, byte[] bundle) {
        return s.http.put("/models/routing/versions/" + tag, "application/octet-stream", bundle, Served.AS_ADMIN);
    }

    @Test
    void a_bundle_whose_checksums_hold_but_whose_contents_do_not_load_is_refused_with_422_and_nothing_is_stored() {
        byte[] good = TestBundles.svm();
        Map<String, byte[]> unusable = new LinkedHashMap<>();
        unusable.put("malformed feature JSON", rewritten(good, BundleArchive.FEATURES, utf8("{\"features\": [")));
        unusable.put("an empty tokenizer", rewritten(good, BundleArchive.TOKENIZER, utf8("{}")));
        unusable.put("weights for no features", rewritten(good, BundleArchive.WEIGHTS, new byte[0]));
        try (Served s = Served.on(dir)) {
            unusable.forEach((what, bundle) -> {
                Http.Answer answer = put(s, "1", bundle);
                assertThat(answer.status()).as(what + ": " + answer.body()).isEqualTo(422);
                assertThat(answer.json().get("type").asText()).as(what).isEqualTo("urn:pressmark:problem:bundle-unusable");
                assertThat(answer.json().get("detail").asText()).as(what).startsWith("cannot publish routing 1: ");
            });
            assertThat(s.store.models()).isEmpty();
        }
    }

    @Test
    void a_bundle_past_a_declared_limit_is_refused_with_422_naming_the_limit() {
        byte[] good = TestBundles.svm();
        byte[] weights = BundleArchive.read(good).entry(BundleArchive.WEIGHTS).clone();
        ByteBuffer.wrap(weights).order(ByteOrder.LITTLE_ENDIAN).putInt(16, Integer.MAX_VALUE); // weights.bin's int32 features
        ObjectNode tokenizer = JsonNodeFactory.instance.objectNode().put("kind", "wordpiece").put("max_word_chars", 100);
        tokenizer.putObject("normalizer").put("lowercase", true).put("strip_accents", true).put("split_cjk", true);
        var vocabulary = tokenizer.putArray("vocabulary").add("[UNK]");
        for (int i = 0; i < BundleLimits.DEFAULT_MAX_VOCABULARY_TOKENS; i++) {
            vocabulary.add("t" + i);
        }
        try (Served s = Served.on(dir)) {
            Http.Answer features = put(s, "1", rewritten(good, BundleArchive.WEIGHTS, weights));
            assertThat(features.status()).as(features.body()).isEqualTo(422);
            assertThat(features.json().get("type").asText()).isEqualTo("urn:pressmark:problem:bundle-limit");
            assertThat(features.json().get("detail").asText()).isEqualTo("cannot publish routing 1: weights.bin: the header declares"
                    + " 2,147,483,647 features, more than 1,048,576, the limit on a model's features");
            Http.Answer tokens = put(s, "1", rewritten(good, BundleArchive.TOKENIZER, utf8(tokenizer.toString())));
            assertThat(tokens.status()).as(tokens.body()).isEqualTo(422);
            assertThat(tokens.json().get("detail").asText())
                    .isEqualTo("cannot publish routing 1: tokenizer.json: vocabulary has more than 1,048,576 tokens, the limit on a vocabulary's size");
            assertThat(s.store.models()).isEmpty();
        }
    }

    @Test
    void an_activation_checked_against_a_version_another_replica_replaced_meanwhile_answers_409_and_changes_nothing() throws Exception {
        String url = "sqlite:" + dir.resolve("store.db");
        BundleStore real = BundleStore.open(url);
        real.publish("routing", "1.0.0", TestBundles.svm(), "test");
        real.publish("routing", "1.1.0", TestBundles.logistic(), "test");
        real.publish("routing", "1.2.0", TestBundles.train(3, "classifier: {kind: linear-svm}"), "test");
        real.activate("routing", "1.0.0", "test", "first");
        AtomicBoolean interleaved = new AtomicBoolean();
        try (BundleStore other = BundleStore.open(url);
                Served s = Served.over(url, racing(real, other, interleaved))) {
            s.awaitServing("1.0.0");
            Http.Answer answer = s.http.putJson("/models/routing/active", "{\"tag\":\"1.2.0\"}", Served.AS_ADMIN);
            assertThat(interleaved).isTrue();
            assertThat(answer.status()).as(answer.body()).isEqualTo(409);
            assertThat(answer.json().get("type").asText()).isEqualTo("urn:pressmark:problem:active-changed");
            assertThat(answer.json().get("detail").asText())
                    .isEqualTo("cannot activate routing 1.2.0: the active version changed from 1.0.0 to 1.1.0 since it was checked; check again");
            assertThat(real.activeVersion("routing").orElseThrow().tag()).isEqualTo("1.1.0");
            Http.Answer again = s.http.putJson("/models/routing/active", "{\"tag\":\"1.2.0\"}", Served.AS_ADMIN);
            assertThat(again.status()).as(again.body()).isEqualTo(200);
            assertThat(again.json().get("serving").asText()).isEqualTo("1.2.0");
        }
    }

    /**
     * {@code store} itself, except that the first load of routing 1.2.0 (the step of an activation
     * between its check and its write) first lets {@code other} activate 1.1.0, as another replica would.
     */
    private static BundleStore racing(BundleStore store, BundleStore other, AtomicBoolean interleaved) {
        return (BundleStore) Proxy.newProxyInstance(BundleStore.class.getClassLoader(), new Class<?>[] {BundleStore.class},
                (proxy, method, args) -> {
                    if (method.getName().equals("load") && "1.2.0".equals(args[1]) && interleaved.compareAndSet(false, true)) {
                        other.activate("routing", "1.1.0", "other replica", "in between");
                    }
                    try {
                        return method.invoke(store, args);
                    } catch (InvocationTargetException e) {
                        throw e.getCause();
                    }
                });
    }

    @Test
    void readiness_reads_the_store_so_a_zeroed_page_under_the_versions_turns_it_503_while_the_loaded_version_serves() throws Exception {
        String url = "sqlite:" + dir.resolve("store.db");
        Path file = dir.resolve("store.db");
        try (BundleStore store = BundleStore.open(url)) {
            byte[] bundle = TestBundles.svm();
            store.publish("routing", "v0", bundle, "test");
            store.activate("routing", "v0", "test", "first");
            for (int i = 1; i < 40; i++) {
                store.publish("routing", "v" + i, bundle, "test");
            }
        }
        long newest = newestLeafOfTheVersionsTable(file);
        try (FileChannel channel = FileChannel.open(file, StandardOpenOption.WRITE)) {
            channel.write(ByteBuffer.allocate(PAGE_BYTES), (newest - 1) * PAGE_BYTES);
        }
        try (Served s = Served.on(dir)) {
            s.awaitServing("v0");
            assertThat(s.http.get("/models/routing/versions").status()).isEqualTo(500);
            Http.Answer ready = s.http.get("/health/ready");
            assertThat(ready.status()).as(ready.body()).isEqualTo(503);
            assertThat(ready.json().get("store").asText()).startsWith("down: ").contains("malformed");
            assertThat(s.servedVersion()).isEqualTo("v0");
        }
    }

    /** SQLite's default page size (sqlite.org, "Database File Format", 1.3.2); the store keeps it. */
    private static final int PAGE_BYTES = 4096;

    /**
     * The right-most child of the versions table's root page: the leaf of the newest rows, not of
     * the first (active) one. An interior table page starts with type 0x05 and holds its right-most
     * child pointer at offset 8, big-endian (sqlite.org, "Database File Format", 1.6).
     */
    private static long newestLeafOfTheVersionsTable(Path file) throws Exception {
        long root;
        try (Connection c = DriverManager.getConnection("jdbc:sqlite:" + file); Statement s = c.createStatement()) {
            s.execute("PRAGMA wal_checkpoint(TRUNCATE)");
            try (ResultSet rs = s.executeQuery("SELECT rootpage FROM sqlite_master WHERE type = 'table' AND name = 'versions'")) {
                rs.next();
                root = rs.getLong(1);
            }
        }
        ByteBuffer page = ByteBuffer.allocate(PAGE_BYTES);
        try (FileChannel channel = FileChannel.open(file, StandardOpenOption.READ)) {
            channel.read(page, (root - 1) * PAGE_BYTES);
        }
        assertThat(page.get(0)).as("the versions table's root is an interior page").isEqualTo((byte) 0x05);
        return page.getInt(8) & 0xffffffffL;
    }
}
