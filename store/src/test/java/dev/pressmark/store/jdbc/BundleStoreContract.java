package dev.pressmark.store.jdbc;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import dev.pressmark.core.bundle.BundleArchive;
import dev.pressmark.store.Activation;
import dev.pressmark.store.BundleStore;
import dev.pressmark.store.LoadedBundle;
import dev.pressmark.store.ModelSummary;
import dev.pressmark.store.Names;
import dev.pressmark.store.PublishOptions;
import dev.pressmark.store.Shadow;
import dev.pressmark.store.ShadowReport;
import dev.pressmark.store.ShadowSummary;
import dev.pressmark.store.StoreEvent;
import dev.pressmark.store.StoreException;
import dev.pressmark.store.VerifyReport;
import dev.pressmark.store.Version;
import dev.pressmark.store.lifecycle.Promotion;
import dev.pressmark.store.lifecycle.PromotionPolicy;
import java.security.MessageDigest;
import java.sql.Connection;
import java.sql.PreparedStatement;
import java.sql.SQLException;
import java.sql.Statement;
import java.time.Duration;
import java.util.ArrayList;
import java.util.HexFormat;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import java.util.TreeSet;
import java.util.concurrent.ConcurrentHashMap;
import java.util.concurrent.CountDownLatch;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;

/**
 * The store's contract, run on each backend by a subclass that says where a fresh, empty store
 * is and how to reach its tables directly.
 */
abstract class BundleStoreContract {

    static final String ACTOR = "ci";

    BundleStore store;

    /** A URL of a fresh, empty store for the current test. */
    abstract String freshStoreUrl() throws Exception;

    /** A direct JDBC connection to the tables of the store last opened, bypassing it. */
    abstract Connection rawConnection() throws SQLException;

    String url;

    @BeforeEach
    void openStore() throws Exception {
        url = freshStoreUrl();
        store = JdbcStores.open(url);
    }

    @AfterEach
    void closeStore() {
        if (store != null) {
            store.close();
        }
    }

    private Version publish(String model, String tag, long seed) {
        return store.publish(model, tag, TestBundles.bundle(model, seed), ACTOR);
    }

    private static String jdkSha256(byte[] bytes) throws Exception {
        // the JDK's digest, independent of the project's helper (which is checked against NIST's vectors)
        return HexFormat.of().formatHex(MessageDigest.getInstance("SHA-256").digest(bytes));
    }

    @Test
    void a_published_version_is_listed_with_the_whole_files_sha256_and_size_and_is_not_active() throws Exception {
        byte[] bundle = TestBundles.bundle("routing", 1);
        Version published = store.publish("routing", "1.0.0", bundle, ACTOR);
        assertThat(published.sha256()).isEqualTo(jdkSha256(bundle));
        List<Version> versions = store.versions("routing");
        assertThat(versions).hasSize(1);
        Version listed = versions.get(0);
        assertThat(listed.tag()).isEqualTo("1.0.0");
        assertThat(listed.sha256()).isEqualTo(jdkSha256(bundle));
        assertThat(listed.sizeBytes()).isEqualTo(bundle.length);
        assertThat(listed.active()).isFalse();
        assertThat(listed.retired()).isFalse();
        assertThat(listed.manifestJson()).contains("\"name\":\"routing\"").contains("\"format_version\":1");
        assertThat(store.activeVersion("routing")).isEmpty();
        assertThat(store.models()).extracting(ModelSummary::name).containsExactly("routing");
    }

    @Test
    void versions_are_listed_newest_first() {
        publish("routing", "1.0.0", 1);
        publish("routing", "1.1.0", 2);
        publish("routing", "0.9.0", 3);
        assertThat(store.versions("routing")).extracting(Version::tag).containsExactly("0.9.0", "1.1.0", "1.0.0");
    }

    @Test
    void a_published_tag_is_immutable_even_with_identical_bytes() {
        byte[] bundle = TestBundles.bundle("routing", 1);
        store.publish("routing", "1.0.0", bundle, ACTOR);
        assertThatThrownBy(() -> store.publish("routing", "1.0.0", bundle, ACTOR))
                .isInstanceOf(StoreException.class)
                .hasMessageContaining("immutable")
                .extracting(e -> ((StoreException) e).code()).isEqualTo(StoreException.TAG_EXISTS);
        assertThatThrownBy(() -> store.publish("routing", "1.0.0", TestBundles.bundle("routing", 2), ACTOR))
                .hasMessageContaining("routing 1.0.0 is already published");
        assertThat(store.versions("routing")).hasSize(1);
    }

    @Test
    void the_same_tag_may_exist_under_two_models() {
        publish("routing", "1.0.0", 1);
        publish("risk", "1.0.0", 2);
        assertThat(store.models()).extracting(ModelSummary::name).containsExactly("risk", "routing");
    }

    @Test
    void activating_a_version_makes_it_the_only_active_one() {
        publish("routing", "1.0.0", 1);
        publish("routing", "1.1.0", 2);
        store.activate("routing", "1.0.0", ACTOR, "first");
        store.activate("routing", "1.1.0", ACTOR, "better");
        assertThat(store.activeVersion("routing")).map(Version::tag).contains("1.1.0");
        assertThat(store.versions("routing")).filteredOn(Version::active).extracting(Version::tag).containsExactly("1.1.0");
        assertThat(store.models().get(0).activeTag()).contains("1.1.0");
    }

    @Test
    void activating_the_active_version_again_appends_nothing() {
        publish("routing", "1.0.0", 1);
        Activation first = store.activate("routing", "1.0.0", ACTOR, "");
        Activation again = store.activate("routing", "1.0.0", ACTOR, "");
        assertThat(again.sequence()).isEqualTo(first.sequence());
        assertThat(store.activations("routing")).hasSize(1);
    }

    @Test
    void repeated_rollbacks_walk_back_through_the_activation_history_and_stop_at_its_start() {
        publish("routing", "a", 1);
        publish("routing", "b", 2);
        publish("routing", "c", 3);
        store.activate("routing", "a", ACTOR, "");
        store.activate("routing", "b", ACTOR, "");
        store.activate("routing", "c", ACTOR, "");

        assertThat(store.rollback("routing", ACTOR).tag()).isEqualTo("b");
        assertThat(store.activeVersion("routing")).map(Version::tag).contains("b");
        assertThat(store.rollback("routing", ACTOR).tag()).isEqualTo("a");
        assertThatThrownBy(() -> store.rollback("routing", ACTOR))
                .isInstanceOf(StoreException.class)
                .hasMessageContaining("start of its activation history")
                .extracting(e -> ((StoreException) e).code()).isEqualTo(StoreException.NO_ROLLBACK);
        assertThat(store.activeVersion("routing")).map(Version::tag).contains("a");
        // the history is append-only: three activations and two rollbacks
        assertThat(store.activations("routing")).extracting(Activation::tag).containsExactly("a", "b", "c", "b", "a");
        assertThat(store.activations("routing")).extracting(Activation::rollback).containsExactly(true, true, false, false, false);
    }

    @Test
    void an_activation_after_a_rollback_rolls_back_to_the_version_it_replaced() {
        publish("routing", "a", 1);
        publish("routing", "b", 2);
        publish("routing", "c", 3);
        store.activate("routing", "a", ACTOR, "");
        store.activate("routing", "b", ACTOR, "");
        store.rollback("routing", ACTOR);
        store.activate("routing", "c", ACTOR, "");
        assertThat(store.rollback("routing", ACTOR).tag()).isEqualTo("a");
    }

    @Test
    void rolling_back_a_model_never_activated_fails_clearly() {
        publish("routing", "a", 1);
        assertThatThrownBy(() -> store.rollback("routing", ACTOR))
                .isInstanceOf(StoreException.class).hasMessage("routing has never been activated; there is nothing to roll back");
    }

    @Test
    void a_retired_version_cannot_be_activated_and_the_active_one_cannot_be_retired() {
        publish("routing", "a", 1);
        publish("routing", "b", 2);
        store.activate("routing", "a", ACTOR, "");
        assertThatThrownBy(() -> store.retire("routing", "a", ACTOR, "superseded"))
                .isInstanceOf(StoreException.class).hasMessageContaining("active version and cannot be retired")
                .extracting(e -> ((StoreException) e).code()).isEqualTo(StoreException.ACTIVE);
        store.retire("routing", "b", ACTOR, "superseded");
        assertThat(store.version("routing", "b")).map(Version::retired).contains(true);
        assertThatThrownBy(() -> store.activate("routing", "b", ACTOR, ""))
                .isInstanceOf(StoreException.class).hasMessage("routing b is retired and cannot be activated");
        assertThat(store.activeVersion("routing")).map(Version::tag).contains("a");
    }

    @Test
    void retiring_records_the_reason_and_a_retired_version_stays_readable_and_loadable() {
        publish("routing", "a", 1);
        Version b = publish("routing", "b", 2);
        store.activate("routing", "a", ACTOR, "");
        Version retired = store.retire("routing", "b", "erin", "  labels of the March export were wrong ");
        assertThat(retired.retired()).isTrue();
        assertThat(retired.active()).isFalse();
        assertThat(retired.sha256()).isEqualTo(b.sha256());
        StoreEvent event = store.events("routing").get(0);
        assertThat(event.action()).isEqualTo(StoreEvent.RETIRE);
        assertThat(event.tag()).isEqualTo("b");
        assertThat(event.actor()).isEqualTo("erin");
        assertThat(event.detail()).isEqualTo("labels of the March export were wrong");
        assertThat(store.versions("routing")).extracting(Version::tag, Version::retired)
                .containsExactly(org.assertj.core.groups.Tuple.tuple("b", true), org.assertj.core.groups.Tuple.tuple("a", false));
        assertThat(store.load("routing", "b").version().sha256()).isEqualTo(b.sha256());
        assertThat(store.verify(Optional.of("routing")).ok()).isTrue();
    }

    @Test
    void a_version_cannot_be_retired_twice_without_a_reason_or_when_it_does_not_exist_and_a_refusal_changes_nothing() {
        publish("routing", "a", 1);
        publish("routing", "b", 2);
        for (String reason : new String[] {null, "", "   "}) {
            assertThatThrownBy(() -> store.retire("routing", "b", ACTOR, reason)).hasMessageContaining("a reason is required")
                    .extracting(e -> ((StoreException) e).code()).isEqualTo(StoreException.INVALID_REASON);
        }
        assertThatThrownBy(() -> store.retire("routing", "b", ACTOR, "x".repeat(Names.MAX_REASON_CHARS + 1)))
                .extracting(e -> ((StoreException) e).code()).isEqualTo(StoreException.INVALID_REASON);
        assertThat(store.version("routing", "b")).map(Version::retired).contains(false);
        assertThatThrownBy(() -> store.retire("routing", "zz", ACTOR, "gone"))
                .extracting(e -> ((StoreException) e).code()).isEqualTo(StoreException.NO_SUCH_VERSION);
        assertThatThrownBy(() -> store.retire("nobody", "b", ACTOR, "gone"))
                .extracting(e -> ((StoreException) e).code()).isEqualTo(StoreException.NO_SUCH_MODEL);

        store.retire("routing", "b", ACTOR, "superseded");
        int events = store.events("routing").size();
        assertThatThrownBy(() -> store.retire("routing", "b", ACTOR, "again")).hasMessage("routing b is already retired")
                .extracting(e -> ((StoreException) e).code()).isEqualTo(StoreException.ALREADY_RETIRED);
        assertThat(store.events("routing")).hasSize(events);
        assertThatThrownBy(() -> store.activate("routing", "b", Optional.empty(), ACTOR, ""))
                .extracting(e -> ((StoreException) e).code()).isEqualTo(StoreException.RETIRED);
        assertThat(store.activeVersion("routing")).isEmpty();
    }

    @Test
    void retiring_the_shadowed_version_stops_its_shadow_and_retiring_another_does_not() {
        publish("routing", "a", 1);
        publish("routing", "b", 2);
        publish("routing", "c", 3);
        store.activate("routing", "a", ACTOR, "");
        store.startShadow("routing", "b", 0.5, ACTOR);
        store.retire("routing", "c", ACTOR, "never used");
        assertThat(store.shadow("routing")).map(Shadow::tag).contains("b");
        store.retire("routing", "b", ACTOR, "disagreed too often");
        assertThat(store.shadow("routing")).isEmpty();
        assertThat(store.events("routing")).extracting(StoreEvent::action).startsWith(StoreEvent.SHADOW_STOP, StoreEvent.RETIRE);
        assertThat(store.events("routing").get(0).detail()).isEqualTo("b was retired");
    }

    @Test
    void a_retired_version_is_refused_as_retired_by_the_promotion_rule_even_when_forced() {
        publish("routing", "a", 1);
        publish("routing", "b", 2);
        store.activate("routing", "a", ACTOR, "");
        store.retire("routing", "b", ACTOR, "superseded");
        Promotion.Request forced = new Promotion.Request("routing", "b", true, "urgent", PromotionPolicy.defaults(), ACTOR);
        assertThatThrownBy(() -> Promotion.activate(store, plainActivation("b"), Optional.empty()))
                .extracting(e -> ((StoreException) e).code()).isEqualTo(StoreException.RETIRED);
        assertThatThrownBy(() -> Promotion.activate(store, forced, Optional.empty())).hasMessage("routing b is retired and cannot be activated")
                .extracting(e -> ((StoreException) e).code()).isEqualTo(StoreException.RETIRED);
        assertThat(store.activeVersion("routing")).map(Version::tag).contains("a");
    }

    @Test
    void a_rollback_onto_a_retired_version_is_refused() {
        publish("routing", "a", 1);
        publish("routing", "b", 2);
        store.activate("routing", "a", ACTOR, "");
        store.activate("routing", "b", ACTOR, "");
        store.retire("routing", "a", ACTOR, "superseded");
        assertThatThrownBy(() -> store.rollback("routing", ACTOR))
                .isInstanceOf(StoreException.class).hasMessage("cannot roll back routing to a: it is retired");
        assertThat(store.activeVersion("routing")).map(Version::tag).contains("b");
    }

    @Test
    void a_loaded_version_has_the_published_entries() {
        publish("routing", "1.0.0", 7);
        LoadedBundle loaded = store.load("routing", "1.0.0");
        Map<String, byte[]> expected = TestBundles.entries("routing", 7);
        for (Map.Entry<String, byte[]> entry : expected.entrySet()) {
            assertThat(loaded.contents().entry(entry.getKey())).as(entry.getKey()).isEqualTo(entry.getValue());
        }
        assertThat(loaded.version().tag()).isEqualTo("1.0.0");
    }

    @Test
    void verify_passes_on_untouched_versions() {
        publish("routing", "a", 1);
        publish("risk", "a", 2);
        VerifyReport report = store.verify(Optional.empty());
        assertThat(report.ok()).isTrue();
        assertThat(report.checked()).isEqualTo(2);
        assertThat(store.verify(Optional.of("risk")).checked()).isEqualTo(1);
    }

    @Test
    void bytes_altered_in_the_database_fail_verify_naming_the_version_and_are_never_served() throws Exception {
        publish("routing", "a", 1);
        publish("routing", "b", 2);
        byte[] tampered = TestBundles.bundle("routing", 2);
        tampered[tampered.length / 2] ^= 0x40;
        try (Connection c = rawConnection(); PreparedStatement update = c.prepareStatement("UPDATE versions SET bundle = ? WHERE tag = 'b'")) {
            update.setBytes(1, tampered);
            assertThat(update.executeUpdate()).isEqualTo(1);
        }
        VerifyReport report = store.verify(Optional.empty());
        assertThat(report.ok()).isFalse();
        assertThat(report.checked()).isEqualTo(2);
        assertThat(report.mismatches()).extracting(VerifyReport.Mismatch::model, VerifyReport.Mismatch::tag)
                .containsExactly(org.assertj.core.groups.Tuple.tuple("routing", "b"));
        assertThat(report.mismatches().get(0).describe()).startsWith("routing b: SHA-256 ");
        assertThatThrownBy(() -> store.load("routing", "b"))
                .isInstanceOf(StoreException.class).hasMessageStartingWith("routing b is corrupt and will not be served")
                .extracting(e -> ((StoreException) e).code()).isEqualTo(StoreException.CORRUPT);
        assertThat(store.load("routing", "a").contents().entries()).hasSize(4);
    }

    @Test
    void truncated_bytes_in_the_database_are_reported_with_their_size() throws Exception {
        publish("routing", "a", 1);
        byte[] cut = java.util.Arrays.copyOf(TestBundles.bundle("routing", 1), 100);
        try (Connection c = rawConnection(); PreparedStatement update = c.prepareStatement("UPDATE versions SET bundle = ?")) {
            update.setBytes(1, cut);
            update.executeUpdate();
        }
        VerifyReport.Mismatch mismatch = store.verify(Optional.of("routing")).mismatches().get(0);
        assertThat(mismatch.actualSizeBytes()).isEqualTo(100);
        assertThat(mismatch.describe()).contains("size 100 bytes");
        assertThatThrownBy(() -> store.load("routing", "a")).isInstanceOf(StoreException.class).hasMessageContaining("is corrupt");
    }

    @Test
    void names_and_tags_outside_the_patterns_are_refused_quoting_the_pattern() {
        byte[] bundle = TestBundles.bundle("x", 1);
        for (String name : List.of("Routing", "-routing", "", "routing_v2", "a".repeat(65))) {
            assertThatThrownBy(() -> store.publish(name, "1.0.0", bundle, ACTOR)).as(name)
                    .isInstanceOf(StoreException.class).hasMessageContaining("must match [a-z0-9][a-z0-9-]{0,63}");
        }
        for (String tag : List.of(".1", "1.0 beta", "", "v/1", "t".repeat(65))) {
            assertThatThrownBy(() -> store.publish("routing", tag, bundle, ACTOR)).as(tag)
                    .isInstanceOf(StoreException.class).hasMessageContaining("must match [A-Za-z0-9][A-Za-z0-9._-]{0,63}");
        }
        assertThat(store.models()).isEmpty();
    }

    @Test
    void bytes_that_are_not_a_bundle_are_refused_and_nothing_is_stored() {
        assertThatThrownBy(() -> store.publish("routing", "1", "title,label\n".getBytes(java.nio.charset.StandardCharsets.UTF_8), ACTOR))
                .isInstanceOf(StoreException.class).hasMessageStartingWith("not a bundle: it does not start as a ZIP file")
                .extracting(e -> ((StoreException) e).code()).isEqualTo(StoreException.NOT_A_BUNDLE);
        byte[] damaged = TestBundles.bundle("routing", 1);
        damaged[200] ^= 1;
        assertThatThrownBy(() -> store.publish("routing", "1", damaged, ACTOR)).isInstanceOf(StoreException.class)
                .hasMessageStartingWith("not a valid bundle: ").hasMessageContaining("checksum");
        assertThat(store.models()).isEmpty();
    }

    @Test
    void a_bundle_whose_checksums_hold_but_whose_contents_do_not_load_is_refused_and_nothing_is_stored() {
        UnusableBundles.unusable().forEach((what, bundle) -> assertThatThrownBy(() -> store.publish("routing", "1", bundle, ACTOR)).as(what)
                .isInstanceOf(StoreException.class).hasMessageStartingWith("cannot publish routing 1: ")
                .extracting(e -> ((StoreException) e).code()).isEqualTo(StoreException.UNUSABLE));
        assertThat(store.models()).isEmpty();
    }

    @Test
    void a_bundle_past_a_declared_limit_is_refused_naming_the_limit_and_nothing_is_stored() {
        assertThatThrownBy(() -> store.publish("routing", "1", UnusableBundles.claimingMaxIntFeatures(), ACTOR))
                .isInstanceOf(StoreException.class)
                .hasMessage("cannot publish routing 1: weights.bin: the header declares 2,147,483,647 features, more than 1,048,576,"
                        + " the limit on a model's features")
                .extracting(e -> ((StoreException) e).code()).isEqualTo(StoreException.LIMIT);
        assertThatThrownBy(() -> store.publish("routing", "1", UnusableBundles.vocabularyPastTheLimit(), ACTOR))
                .isInstanceOf(StoreException.class)
                .hasMessage("cannot publish routing 1: tokenizer.json: vocabulary has more than 1,048,576 tokens, the limit on a vocabulary's size")
                .extracting(e -> ((StoreException) e).code()).isEqualTo(StoreException.LIMIT);
        assertThat(store.models()).isEmpty();
    }

    /** Stores {@code bundle} under its true SHA-256 by SQL, past the store's publish checks: as a store written by an older program holds it. */
    void storeBehindTheStoresBack(String model, String tag, byte[] bundle) throws Exception {
        try (Connection c = rawConnection()) {
            try (PreparedStatement insert = c.prepareStatement("INSERT INTO models (name, created_at) VALUES (?, 0) ON CONFLICT (name) DO NOTHING")) {
                insert.setString(1, model);
                insert.executeUpdate();
            }
            try (PreparedStatement insert = c.prepareStatement("INSERT INTO versions (model, tag, sha256, size, created_at, manifest_json, bundle)"
                    + " VALUES (?, ?, ?, ?, 0, ?, ?)")) {
                insert.setString(1, model);
                insert.setString(2, tag);
                insert.setString(3, jdkSha256(bundle));
                insert.setLong(4, bundle.length);
                insert.setString(5, BundleArchive.read(bundle).manifestJson());
                insert.setBytes(6, bundle);
                insert.executeUpdate();
            }
        }
    }

    @Test
    void verify_reports_each_stored_version_that_does_not_load_though_its_checksum_matches() throws Exception {
        publish("routing", "good", 1);
        storeBehindTheStoresBack("routing", "bad", UnusableBundles.claimingMaxIntFeatures());
        storeBehindTheStoresBack("routing", "empty", UnusableBundles.unusable().get("an empty tokenizer"));
        VerifyReport report = store.verify(Optional.empty());
        assertThat(report.checked()).isEqualTo(3);
        assertThat(report.mismatches()).isEmpty();
        assertThat(report.ok()).isFalse();
        assertThat(report.unusable()).extracting(VerifyReport.Unusable::tag).containsExactly("bad", "empty");
        assertThat(report.unusable().get(0).describe())
                .isEqualTo("routing bad: weights.bin: the header declares 2,147,483,647 features, more than 1,048,576, the limit on a model's features");
        assertThat(store.verify(Optional.of("routing")).unusable()).hasSize(2);
    }

    @Test
    void an_activation_that_expected_another_active_version_fails_cleanly_and_changes_nothing() {
        publish("routing", "a", 1);
        publish("routing", "b", 2);
        publish("routing", "c", 3);
        store.activate("routing", "a", ACTOR, "first");
        try (BundleStore other = JdbcStores.open(url)) {
            // this handle checked c against a; meanwhile another replica makes b active
            other.activate("routing", "b", "other", "in between");
            assertThatThrownBy(() -> store.activate("routing", "c", Optional.of("a"), ACTOR, "checked against a"))
                    .isInstanceOf(StoreException.class)
                    .hasMessage("cannot activate routing c: the active version changed from a to b since it was checked; check again")
                    .extracting(e -> ((StoreException) e).code()).isEqualTo(StoreException.ACTIVE_CHANGED);
            assertThat(store.activeVersion("routing")).map(Version::tag).contains("b");
            assertThat(store.activations("routing")).hasSize(2);
            assertThat(store.activate("routing", "c", Optional.of("b"), ACTOR, "checked against b").tag()).isEqualTo("c");
            assertThat(other.activeVersion("routing")).map(Version::tag).contains("c");
        }
    }

    @Test
    void an_activation_that_expected_no_active_version_fails_once_one_is_active() {
        publish("routing", "a", 1);
        publish("routing", "b", 2);
        store.activate("routing", "a", ACTOR, "first");
        assertThatThrownBy(() -> store.activate("routing", "b", Optional.empty(), ACTOR, ""))
                .hasMessage("cannot activate routing b: the active version changed from none to a since it was checked; check again");
        assertThat(store.activate("routing", "a", Optional.of("a"), ACTOR, "again").tag()).isEqualTo("a");
        assertThat(store.activations("routing")).hasSize(1);
    }

    private static Promotion.Request plainActivation(String tag) {
        return new Promotion.Request("routing", tag, false, "", PromotionPolicy.defaults(), ACTOR);
    }

    @Test
    void a_promotion_checked_against_a_version_that_another_client_replaced_meanwhile_fails_cleanly() throws Exception {
        publish("routing", "a", 1);
        publish("routing", "b", 2);
        publish("routing", "c", 3);
        store.activate("routing", "a", ACTOR, "first");
        try (BundleStore other = JdbcStores.open(url)) {
            // the real store, except that its load (the step between the check and the write) lets another client activate b first
            BundleStore interleaved = (BundleStore) java.lang.reflect.Proxy.newProxyInstance(BundleStore.class.getClassLoader(),
                    new Class<?>[] {BundleStore.class}, (proxy, method, args) -> {
                        if (method.getName().equals("load")) {
                            other.activate("routing", "b", "other", "in between");
                        }
                        try {
                            return method.invoke(store, args);
                        } catch (java.lang.reflect.InvocationTargetException e) {
                            throw e.getCause();
                        }
                    });
            assertThatThrownBy(() -> Promotion.activate(interleaved, plainActivation("c"), Optional.empty()))
                    .isInstanceOf(StoreException.class)
                    .hasMessage("cannot activate routing c: the active version changed from a to b since it was checked; check again")
                    .extracting(e -> ((StoreException) e).code()).isEqualTo(StoreException.ACTIVE_CHANGED);
            assertThat(store.activeVersion("routing")).map(Version::tag).contains("b");
            assertThat(store.activations("routing")).extracting(Activation::tag).containsExactly("b", "a");
        }
        Promotion.Result again = Promotion.activate(store, plainActivation("c"), Optional.empty());
        assertThat(again.activation().tag()).isEqualTo("c");
        assertThat(again.outcome().passed()).isTrue();
        assertThat(store.events("routing").get(0).detail()).isEqualTo("replaces b");
    }

    @Test
    void a_promotion_of_a_version_this_process_cannot_load_is_refused_and_the_active_version_stays() throws Exception {
        publish("routing", "a", 1);
        store.activate("routing", "a", ACTOR, "first");
        storeBehindTheStoresBack("routing", "big", UnusableBundles.claimingMaxIntFeatures());
        assertThatThrownBy(() -> Promotion.activate(store, plainActivation("big"), Optional.empty()))
                .isInstanceOf(StoreException.class)
                .hasMessage("cannot activate routing big: weights.bin: the header declares 2,147,483,647 features, more than 1,048,576,"
                        + " the limit on a model's features")
                .extracting(e -> ((StoreException) e).code()).isEqualTo(StoreException.LIMIT);
        assertThat(store.activeVersion("routing")).map(Version::tag).contains("a");
        assertThat(store.activations("routing")).hasSize(1);
    }

    @Test
    void forcing_a_promotion_needs_a_reason() {
        assertThatThrownBy(() -> new Promotion.Request("routing", "a", true, " ", PromotionPolicy.defaults(), ACTOR))
                .isInstanceOf(IllegalArgumentException.class).hasMessageContaining("reason is required");
    }

    @Test
    void a_bundle_published_from_a_file_is_streamed_into_the_store_with_the_files_sha256() throws Exception {
        java.nio.file.Path dir = java.nio.file.Files.createTempDirectory("pressmark-publish");
        try {
            byte[] bundle = TestBundles.sized("routing", 5, TestBundles.FIELDS, TestBundles.LABELS, 4096);
            java.nio.file.Path file = java.nio.file.Files.write(dir.resolve("b.pmb"), bundle);
            Version published = store.publish("routing", "1", file, PublishOptions.DEFAULT, ACTOR);
            assertThat(published.sha256()).isEqualTo(jdkSha256(bundle));
            assertThat(published.sizeBytes()).isEqualTo(bundle.length);
            // load recomputes the SHA-256 of the stored bytes and refuses them when it differs from the recorded one
            assertThat(store.load("routing", "1").contents().entry(BundleArchive.WEIGHTS)).isEqualTo(BundleArchive.read(bundle).entry(BundleArchive.WEIGHTS));
            assertThat(store.verify(Optional.empty()).ok()).isTrue();
        } finally {
            try (var files = java.nio.file.Files.walk(dir)) {
                files.sorted(java.util.Comparator.reverseOrder()).forEach(p -> p.toFile().delete());
            }
        }
    }

    @Test
    void a_device_a_directory_or_a_file_past_the_size_limit_is_refused_before_it_is_read() throws Exception {
        java.nio.file.Path dir = java.nio.file.Files.createTempDirectory("pressmark-publish");
        try {
            assertThatThrownBy(() -> store.publish("routing", "1", java.nio.file.Path.of("/dev/zero"), PublishOptions.DEFAULT, ACTOR))
                    .isInstanceOf(StoreException.class)
                    .hasMessage("/dev/zero: not a regular file (a directory, device or pipe); a bundle is a file");
            assertThatThrownBy(() -> store.publish("routing", "1", dir, PublishOptions.DEFAULT, ACTOR))
                    .hasMessageEndingWith("not a regular file (a directory, device or pipe); a bundle is a file");
            java.nio.file.Path huge = dir.resolve("huge.pmb");
            try (java.io.RandomAccessFile sparse = new java.io.RandomAccessFile(huge.toFile(), "rw")) {
                sparse.setLength(BundleArchive.MAX_BUNDLE_BYTES + 1); // sparse: no disk blocks, nothing to read
            }
            assertThatThrownBy(() -> store.publish("routing", "1", huge, PublishOptions.DEFAULT, ACTOR))
                    .isInstanceOf(StoreException.class)
                    .hasMessage(huge + ": 536,870,913 bytes, more than 536,870,912, the limit on a bundle's size")
                    .extracting(e -> ((StoreException) e).code()).isEqualTo(StoreException.LIMIT);
            java.nio.file.Path zeros = dir.resolve("zeros.pmb");
            try (java.io.RandomAccessFile sparse = new java.io.RandomAccessFile(zeros.toFile(), "rw")) {
                sparse.setLength(400L << 20);
            }
            assertThatThrownBy(() -> store.publish("routing", "1", zeros, PublishOptions.DEFAULT, ACTOR))
                    .hasMessage(zeros + ": not a bundle: it does not start as a ZIP file")
                    .extracting(e -> ((StoreException) e).code()).isEqualTo(StoreException.NOT_A_BUNDLE);
            assertThat(store.models()).isEmpty();
        } finally {
            try (var files = java.nio.file.Files.walk(dir)) {
                files.sorted(java.util.Comparator.reverseOrder()).forEach(p -> p.toFile().delete());
            }
        }
    }

    @Test
    void unknown_models_and_versions_are_named() {
        publish("routing", "a", 1);
        assertThatThrownBy(() -> store.activate("routing", "zz", ACTOR, "")).hasMessage("no version zz of model routing in the store");
        assertThatThrownBy(() -> store.activate("nobody", "a", ACTOR, "")).hasMessage("no model nobody in the store");
        assertThatThrownBy(() -> store.versions("nobody")).hasMessage("no model nobody in the store");
        assertThatThrownBy(() -> store.verify(Optional.of("nobody"))).hasMessage("no model nobody in the store");
        assertThatThrownBy(() -> store.load("routing", "zz")).hasMessage("no version zz of model routing in the store");
    }

    @Test
    void every_change_is_an_event_with_its_actor() {
        publish("routing", "a", 1);
        publish("routing", "b", 2);
        store.activate("routing", "a", "alice", "launch");
        store.activate("routing", "b", "bob", "");
        store.rollback("routing", "carol");
        store.retire("routing", "b", "dave", "labels were wrong");
        List<StoreEvent> events = store.events("routing");
        assertThat(events).extracting(StoreEvent::action).containsExactly("retire", "rollback", "activate", "activate", "publish", "publish");
        assertThat(events).extracting(StoreEvent::actor).containsExactly("dave", "carol", "bob", "alice", ACTOR, ACTOR);
        assertThat(events.get(3).detail()).contains("launch");
        assertThat(events.get(1).detail()).isEqualTo("rolled back from b");
    }

    @Test
    void the_change_sequence_grows_with_every_activation_and_lists_what_changed() throws InterruptedException {
        assertThat(store.changeSequence()).isZero();
        publish("routing", "a", 1);
        publish("risk", "a", 2);
        assertThat(store.changeSequence()).isZero();
        long first = store.activate("routing", "a", ACTOR, "").sequence();
        long second = store.activate("risk", "a", ACTOR, "").sequence();
        assertThat(second).isGreaterThan(first);
        assertThat(store.changeSequence()).isEqualTo(second);
        assertThat(store.activationsSince(first)).extracting(Activation::model).containsExactly("risk");
        assertThat(store.awaitChange(0, Duration.ofSeconds(5))).isEqualTo(second);
    }

    @Test
    void a_waiter_wakes_when_another_connection_activates() throws Exception {
        publish("routing", "a", 1);
        long before = store.changeSequence();
        ExecutorService executor = Executors.newSingleThreadExecutor();
        try (BundleStore other = JdbcStores.open(url)) {
            Future<Long> waiter = executor.submit(() -> store.awaitChange(before, Duration.ofSeconds(30)));
            Thread.sleep(300);
            other.activate("routing", "a", ACTOR, "");
            assertThat(waiter.get(30, TimeUnit.SECONDS)).isGreaterThan(before);
        } finally {
            executor.shutdownNow();
        }
    }

    @Test
    void a_shadow_of_a_published_version_runs_until_stopped_and_both_changes_are_audited() {
        publish("routing", "a", 1);
        publish("routing", "b", 2);
        store.activate("routing", "a", ACTOR, "");
        Shadow started = store.startShadow("routing", "b", 0.25, ACTOR);
        assertThat(started.fraction()).isEqualTo(0.25);
        assertThat(store.shadow("routing")).contains(started);
        assertThat(store.shadows()).containsExactly(started);
        assertThat(store.stopShadow("routing", ACTOR, "enough")).contains(started);
        assertThat(store.shadow("routing")).isEmpty();
        assertThat(store.stopShadow("routing", ACTOR, "again")).isEmpty();
        assertThat(store.events("routing")).extracting(StoreEvent::action).startsWith(StoreEvent.SHADOW_STOP, StoreEvent.SHADOW_START);
        assertThat(store.events("routing").get(0).detail()).isEqualTo("enough");
    }

    @Test
    void a_shadow_of_the_active_an_unknown_or_a_retired_version_or_with_a_bad_fraction_is_refused() {
        publish("routing", "a", 1);
        publish("routing", "b", 2);
        assertThatThrownBy(() -> store.startShadow("routing", "b", 0.2, ACTOR))
                .extracting(e -> ((StoreException) e).code()).isEqualTo(StoreException.NO_ACTIVE);
        store.activate("routing", "a", ACTOR, "");
        assertThatThrownBy(() -> store.startShadow("routing", "a", 0.2, ACTOR))
                .extracting(e -> ((StoreException) e).code()).isEqualTo(StoreException.SHADOW_OF_ACTIVE);
        assertThatThrownBy(() -> store.startShadow("routing", "zz", 0.2, ACTOR))
                .extracting(e -> ((StoreException) e).code()).isEqualTo(StoreException.NO_SUCH_VERSION);
        assertThatThrownBy(() -> store.startShadow("routing", "b", 0.0, ACTOR)).hasMessageContaining("fraction must be in (0, 1]")
                .extracting(e -> ((StoreException) e).code()).isEqualTo(StoreException.INVALID_FRACTION);
        assertThatThrownBy(() -> store.startShadow("routing", "b", 1.5, ACTOR)).hasMessageContaining("was 1.5");
        store.retire("routing", "b", ACTOR, "superseded");
        assertThatThrownBy(() -> store.startShadow("routing", "b", 0.2, ACTOR))
                .extracting(e -> ((StoreException) e).code()).isEqualTo(StoreException.RETIRED);
        assertThat(store.shadow("routing")).isEmpty();
    }

    @Test
    void activating_the_candidate_or_rolling_back_stops_the_shadow_in_the_same_step() {
        publish("routing", "a", 1);
        publish("routing", "b", 2);
        publish("routing", "c", 3);
        store.activate("routing", "a", ACTOR, "");
        store.startShadow("routing", "b", 0.5, ACTOR);
        store.activate("routing", "b", ACTOR, "promoted");
        assertThat(store.shadow("routing")).isEmpty();
        assertThat(store.events("routing").get(0).action()).isEqualTo(StoreEvent.SHADOW_STOP);
        assertThat(store.events("routing").get(0).detail()).contains("active version changed to b");

        store.startShadow("routing", "c", 0.5, ACTOR);
        store.rollback("routing", ACTOR);
        assertThat(store.shadow("routing")).isEmpty();
        assertThat(store.events("routing").get(0).detail()).contains("rolled back to a");
    }

    @Test
    void shadow_reports_are_kept_per_replica_and_run_and_the_newest_run_is_read_back() {
        publish("routing", "a", 1);
        publish("routing", "b", 2);
        publish("routing", "c", 3);
        store.activate("routing", "a", ACTOR, "");
        Shadow first = store.startShadow("routing", "b", 1.0, ACTOR);
        ShadowSummary.Tally one = new ShadowSummary.Tally("a", "b");
        one.add("x", "x", 0.1, ShadowSummary.SCORE);
        ShadowSummary.Tally two = new ShadowSummary.Tally("a", "b");
        two.add("x", "y", 0.2, ShadowSummary.SCORE);
        store.saveShadowReport(new ShadowReport("routing", "b", "r1", first.startedAt(), first.startedAt(), ShadowSummary.empty("a", "b")));
        store.saveShadowReport(new ShadowReport("routing", "b", "r1", first.startedAt(), first.startedAt().plusSeconds(1), one.summary()));
        store.saveShadowReport(new ShadowReport("routing", "b", "r2", first.startedAt(), first.startedAt(), two.summary()));
        List<ShadowReport> reports = store.shadowReports("routing", Optional.empty());
        assertThat(reports).extracting(ShadowReport::replica).containsExactly("r1", "r2");
        ShadowSummary merged = ShadowReport.merged(reports).orElseThrow();
        assertThat(merged.samples()).isEqualTo(2);
        assertThat(merged.agreeing()).isEqualTo(1);

        Shadow second = store.startShadow("routing", "c", 0.5, ACTOR);
        assertThat(second.startedAt()).isAfter(first.startedAt());
        store.saveShadowReport(new ShadowReport("routing", "c", "r1", second.startedAt(), second.startedAt(), ShadowSummary.empty("a", "c")));
        assertThat(store.shadowReports("routing", Optional.empty())).extracting(ShadowReport::tag).containsExactly("c");
        assertThat(store.shadowReports("routing", Optional.of("b"))).hasSize(2);
        assertThat(store.shadowReports("routing", Optional.of("a"))).isEmpty();
    }

    @Test
    void a_reopened_store_has_everything_that_was_committed() {
        publish("routing", "a", 1);
        store.activate("routing", "a", ACTOR, "");
        store.close();
        store = JdbcStores.open(url);
        assertThat(store.activeVersion("routing")).map(Version::tag).contains("a");
        assertThat(store.verify(Optional.empty()).ok()).isTrue();
    }

    @Test
    void a_store_whose_schema_is_newer_than_the_program_is_refused_naming_both_versions() throws Exception {
        store.close();
        try (Connection c = rawConnection(); Statement s = c.createStatement()) {
            s.executeUpdate("INSERT INTO flyway_schema_history (installed_rank, version, description, type, script, checksum, installed_by,"
                    + " execution_time, success) VALUES (99, '7', 'future', 'SQL', 'V7__future.sql', 0, 'test', 0, " + trueLiteral() + ")");
        }
        assertThatThrownBy(() -> JdbcStores.open(url))
                .isInstanceOf(StoreException.class)
                .hasMessageContaining("has store schema version 7, newer than this program's " + StoreDatabase.SCHEMA_VERSION)
                .extracting(e -> ((StoreException) e).code()).isEqualTo(StoreException.SCHEMA_NEWER);
        store = null;
    }

    @Test
    void a_database_holding_other_tables_is_not_taken_for_a_store() throws Exception {
        store.close();
        store = null;
        try (Connection c = rawConnection(); Statement s = c.createStatement()) {
            s.executeUpdate("DROP TABLE flyway_schema_history");
        }
        assertThatThrownBy(() -> JdbcStores.open(url))
                .isInstanceOf(StoreException.class).hasMessageContaining("is not a pressmark store: it holds other tables")
                .extracting(e -> ((StoreException) e).code()).isEqualTo(StoreException.NOT_A_STORE);
    }

    String trueLiteral() {
        return "TRUE";
    }

    /**
     * Eight threads publish and activate at once. Afterwards every publish that returned is
     * stored exactly once, nothing else is, and at every moment a reader looked, the active
     * version of each model was a stored, non-retired version.
     */
    @Test
    void eight_threads_publishing_and_activating_at_once_lose_and_duplicate_nothing() throws Exception {
        int threads = 8;
        int perThread = 6;
        List<String> models = List.of("alpha", "beta");
        Set<String> published = ConcurrentHashMap.newKeySet();
        List<String> problems = java.util.Collections.synchronizedList(new ArrayList<>());
        ExecutorService pool = Executors.newFixedThreadPool(threads + 1);
        CountDownLatch start = new CountDownLatch(1);
        try {
            List<Future<?>> workers = new ArrayList<>();
            for (int t = 0; t < threads; t++) {
                int thread = t;
                workers.add(pool.submit(() -> {
                    start.await();
                    for (int i = 0; i < perThread; i++) {
                        String model = models.get((thread + i) % models.size());
                        String tag = "t" + thread + "." + i;
                        store.publish(model, tag, TestBundles.bundle(model, thread * 100L + i), "worker-" + thread);
                        published.add(model + " " + tag);
                        store.activate(model, tag, "worker-" + thread, "");
                    }
                    return null;
                }));
            }
            Future<?> reader = pool.submit(() -> {
                start.await();
                while (!workers.stream().allMatch(Future::isDone)) {
                    for (String model : models) {
                        checkActive(model, problems);
                    }
                }
                return null;
            });
            start.countDown();
            for (Future<?> worker : workers) {
                worker.get(120, TimeUnit.SECONDS);
            }
            reader.get(120, TimeUnit.SECONDS);
        } finally {
            pool.shutdownNow();
        }
        assertThat(problems).isEmpty();
        Set<String> stored = new TreeSet<>();
        int rows = 0;
        for (String model : models) {
            for (Version version : store.versions(model)) {
                stored.add(model + " " + version.tag());
                rows++;
            }
            checkActive(model, problems);
        }
        assertThat(rows).isEqualTo(threads * perThread);
        assertThat(stored).isEqualTo(new TreeSet<>(published));
        assertThat(problems).isEmpty();
        assertThat(store.verify(Optional.empty()).ok()).isTrue();
        long activations = models.stream().mapToLong(m -> store.activations(m).size()).sum();
        assertThat(activations).isEqualTo(threads * perThread);
    }

    private void checkActive(String model, List<String> problems) {
        try {
            Optional<Version> active = store.activeVersion(model);
            if (active.isPresent() && (active.get().retired() || !active.get().active())) {
                problems.add(model + ": active pointer names " + active.get());
            }
            List<Version> marked = store.versions(model).stream().filter(Version::active).toList();
            if (marked.size() > 1) {
                problems.add(model + ": " + marked.size() + " versions marked active");
            }
        } catch (StoreException e) {
            if (!e.code().equals(StoreException.NO_SUCH_MODEL)) {
                problems.add(model + ": " + e.getMessage());
            }
        }
    }

    @Test
    void the_manifest_is_kept_as_canonical_json() {
        publish("routing", "a", 1);
        String manifest = store.version("routing", "a").orElseThrow().manifestJson();
        assertThat(manifest).isEqualTo(BundleArchive.read(TestBundles.bundle("routing", 1)).manifestJson());
    }
}
