package dev.pressmark.store;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import dev.pressmark.core.contract.ContractRecord;
import dev.pressmark.core.contract.SemanticVersion;
import dev.pressmark.core.sign.BundleSignature;
import dev.pressmark.core.sign.SigningKeys;
import java.security.KeyPair;
import java.security.MessageDigest;
import java.sql.Connection;
import java.sql.SQLException;
import java.sql.Statement;
import java.util.Base64;
import java.util.HexFormat;
import java.util.List;
import java.util.Optional;
import org.assertj.core.api.ThrowableAssert.ThrowingCallable;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;

/**
 * Signatures and contract versions at publish and at load, run on each backend by a subclass
 * that says where a fresh, empty store is and how to reach its tables directly.
 */
abstract class SignedPublishContract {

    static final String ACTOR = "ci";
    static final List<String> FIELDS = List.of("title");
    static final List<String> LABELS = List.of("heating", "plumbing", "roofing");

    private static final KeyPair KEYS = SigningKeys.generate();
    private static final KeyPair OTHER_KEYS = SigningKeys.generate();

    BundleStore store;

    abstract String freshStoreUrl() throws Exception;

    abstract Connection rawConnection() throws SQLException;

    @BeforeEach
    void openStore() throws Exception {
        store = BundleStore.open(freshStoreUrl());
    }

    @AfterEach
    void closeStore() {
        store.close();
    }

    private static String sha256(byte[] bytes) throws Exception {
        // the JDK's digest, independent of the project's helper
        return HexFormat.of().formatHex(MessageDigest.getInstance("SHA-256").digest(bytes));
    }

    private static String signature(byte[] bundle, KeyPair keys) throws Exception {
        return BundleSignature.sign(sha256(bundle), keys).toJson();
    }

    private static PublishOptions signed(String json) {
        return new PublishOptions(Optional.of(json), false);
    }

    private static void refused(ThrowingCallable call, String code, String... messageParts) {
        assertThatThrownBy(call).isInstanceOf(StoreException.class)
                .satisfies(e -> assertThat(((StoreException) e).code()).isEqualTo(code))
                .satisfies(e -> assertThat(e.getMessage()).contains(messageParts));
    }

    private String keyId() {
        return SigningKeys.keyId(KEYS.getPublic());
    }

    @Test
    void a_store_without_trusted_keys_takes_unsigned_and_signed_bundles_and_keeps_the_signature() throws Exception {
        store.publish("routing", "1", TestBundles.bundle("routing", 1), ACTOR);
        byte[] bundle = TestBundles.bundle("routing", 2);
        String json = signature(bundle, KEYS);
        Version published = store.publish("routing", "2", bundle, signed(json), ACTOR);
        assertThat(published.signatureJson()).contains(json);
        assertThat(store.version("routing", "2").orElseThrow().signatureJson()).contains(json);
        assertThat(store.version("routing", "1").orElseThrow().signatureJson()).isEmpty();
    }

    @Test
    void a_signature_of_other_bytes_is_refused_even_without_trusted_keys() throws Exception {
        String other = signature(TestBundles.bundle("routing", 9), KEYS);
        refused(() -> store.publish("routing", "1", TestBundles.bundle("routing", 1), signed(other), ACTOR), StoreException.BAD_SIGNATURE,
                "cannot publish routing 1: the signature by key " + keyId() + " is for a bundle with SHA-256");
        assertThat(store.models()).isEmpty(); // nothing half-written: not even the model row
    }

    @Test
    void with_a_trusted_key_a_bundle_signed_by_it_is_published_and_loads() throws Exception {
        TrustedKey key = store.trust(SigningKeys.publicKeyPem(KEYS.getPublic()), ACTOR);
        assertThat(key.keyId()).isEqualTo(keyId());
        byte[] bundle = TestBundles.bundle("routing", 1);
        store.publish("routing", "1", bundle, signed(signature(bundle, KEYS)), ACTOR);
        assertThat(store.load("routing", "1").version().sha256()).isEqualTo(sha256(bundle));
        assertThat(store.events("routing").get(0).detail()).contains("signed by key " + keyId());
    }

    @Test
    void with_a_trusted_key_unsigned_tampered_and_foreign_bundles_are_refused() throws Exception {
        store.trust(SigningKeys.publicKeyPem(KEYS.getPublic()), ACTOR);
        byte[] bundle = TestBundles.bundle("routing", 1);
        refused(() -> store.publish("routing", "1", bundle, ACTOR), StoreException.UNSIGNED,
                "cannot publish routing 1: the bundle is unsigned", "[" + keyId() + "]");
        // tampered: the signature names the original bytes, the bytes sent are others
        byte[] tampered = TestBundles.bundle("routing", 2);
        refused(() -> store.publish("routing", "1", tampered, signed(signature(bundle, KEYS)), ACTOR), StoreException.BAD_SIGNATURE,
                "is for a bundle with SHA-256 " + sha256(bundle));
        // a key the store does not trust
        refused(() -> store.publish("routing", "1", bundle, signed(signature(bundle, OTHER_KEYS)), ACTOR), StoreException.BAD_SIGNATURE,
                "signed by key " + SigningKeys.keyId(OTHER_KEYS.getPublic()) + ", which this store does not trust");
        // the trusted key's id with another key's signature: the id matches, the signature does not verify
        BundleSignature forged = new BundleSignature(keyId(), sha256(bundle), BundleSignature.sign(sha256(bundle), OTHER_KEYS).signature());
        refused(() -> store.publish("routing", "1", bundle, signed(forged.toJson()), ACTOR), StoreException.BAD_SIGNATURE,
                "the signature by key " + keyId() + " does not verify over the bundle's SHA-256 " + sha256(bundle));
        assertThat(store.models()).isEmpty(); // nothing half-written: not even the model row
    }

    @Test
    void a_signature_file_of_an_unknown_format_is_refused_naming_the_versions() throws Exception {
        store.trust(SigningKeys.publicKeyPem(KEYS.getPublic()), ACTOR);
        byte[] bundle = TestBundles.bundle("routing", 1);
        String future = signature(bundle, KEYS).replace("\"format\":1", "\"format\":7");
        refused(() -> store.publish("routing", "1", bundle, signed(future), ACTOR), StoreException.BAD_SIGNATURE,
                "signature format 7 is not supported; this program reads format 1");
    }

    @Test
    void a_version_that_no_trusted_key_signed_is_refused_at_load() throws Exception {
        store.publish("routing", "1", TestBundles.bundle("routing", 1), ACTOR);
        byte[] bundle = TestBundles.bundle("routing", 2);
        store.publish("routing", "2", bundle, signed(signature(bundle, KEYS)), ACTOR);
        store.trust(SigningKeys.publicKeyPem(KEYS.getPublic()), ACTOR);
        refused(() -> store.load("routing", "1"), StoreException.UNSIGNED, "routing 1 will not be served: the bundle is unsigned");
        assertThat(store.load("routing", "2").version().tag()).isEqualTo("2");
        store.trust(SigningKeys.publicKeyPem(OTHER_KEYS.getPublic()), ACTOR);
        store.distrust(keyId(), ACTOR);
        refused(() -> store.load("routing", "2"), StoreException.BAD_SIGNATURE, "routing 2 will not be served: the bundle is signed by key "
                + keyId() + ", which this store does not trust");
    }

    @Test
    void trusting_and_distrusting_are_recorded_and_trusting_twice_changes_nothing() {
        String pem = SigningKeys.publicKeyPem(KEYS.getPublic());
        TrustedKey first = store.trust(pem, "alice");
        TrustedKey again = store.trust(pem, "bob");
        assertThat(again).isEqualTo(first);
        assertThat(store.trustedKeys()).containsExactly(first);
        store.distrust(keyId(), "carol");
        assertThat(store.trustedKeys()).isEmpty();
        assertThat(store.storeEvents()).extracting(StoreEvent::action, StoreEvent::actor, StoreEvent::tag)
                .containsExactly(org.assertj.core.groups.Tuple.tuple(StoreEvent.DISTRUST, "carol", keyId()),
                        org.assertj.core.groups.Tuple.tuple(StoreEvent.TRUST, "alice", keyId()));
        refused(() -> store.distrust(keyId(), ACTOR), StoreException.NO_SUCH_KEY, "no trusted key " + keyId());
    }

    @Test
    void a_key_that_is_not_an_ed25519_public_key_is_refused() {
        String privatePem = SigningKeys.privateKeyPem(KEYS.getPrivate());
        refused(() -> store.trust(privatePem, ACTOR), StoreException.INVALID_KEY, "expected a PEM block \"-----BEGIN PUBLIC KEY-----\"");
        String garbage = "-----BEGIN PUBLIC KEY-----\n" + Base64.getEncoder().encodeToString(new byte[44]) + "\n-----END PUBLIC KEY-----\n";
        refused(() -> store.trust(garbage, ACTOR), StoreException.INVALID_KEY, "not an Ed25519 public key");
        assertThat(store.trustedKeys()).isEmpty();
    }

    // ---- contracts ----

    private Version publish(String tag, List<String> fields, List<String> labels, boolean allowBreaking) {
        return store.publish("routing", tag, TestBundles.withContract("routing", tag.hashCode(), fields, labels),
                new PublishOptions(Optional.empty(), allowBreaking), ACTOR);
    }

    @Test
    void the_first_version_is_contract_1_0_0_against_nothing() {
        Version v = publish("a", FIELDS, LABELS, false);
        assertThat(v.contract()).contains(ContractRecord.first());
        assertThat(store.version("routing", "a").orElseThrow().contractJson()).isEqualTo(v.contractJson());
    }

    @Test
    void contract_versions_follow_the_active_version() {
        publish("a", FIELDS, LABELS, false);
        store.activate("routing", "a", ACTOR, "");
        // no change keeps the version; an added label raises the minor
        assertThat(publish("b", FIELDS, LABELS, false).contract().orElseThrow().version()).isEqualTo(SemanticVersion.FIRST);
        Version c = publish("c", FIELDS, List.of("heating", "plumbing", "roofing", "glazing"), false);
        ContractRecord record = c.contract().orElseThrow();
        assertThat(record.version()).isEqualTo(new SemanticVersion(1, 1, 0));
        assertThat(record.against()).contains("a");
        assertThat(record.diff().addedLabels()).containsExactly("glazing");
        store.activate("routing", "c", ACTOR, "");
        // a removed label breaks: refused, then allowed as the next major
        refused(() -> publish("d", FIELDS, List.of("heating", "plumbing", "glazing"), false), StoreException.BREAKING,
                "cannot publish routing d: it breaks the contract of the active version c (1.1.0): removed labels [roofing];"
                        + " allow breaking changes to publish it as contract 2.0.0");
        assertThat(store.version("routing", "d")).isEmpty();
        Version d = publish("d", FIELDS, List.of("heating", "plumbing", "glazing"), true);
        assertThat(d.contract().orElseThrow().version()).isEqualTo(new SemanticVersion(2, 0, 0));
        assertThat(d.contract().orElseThrow().diff().breaking()).isTrue();
        assertThat(store.events("routing").get(0).detail()).contains("contract 2.0.0 (removed labels [roofing] against c)");
    }

    @Test
    void an_added_input_field_is_refused_as_breaking_naming_it() {
        publish("a", FIELDS, LABELS, false);
        store.activate("routing", "a", ACTOR, "");
        refused(() -> publish("b", List.of("title", "body"), LABELS, false), StoreException.BREAKING,
                "added fields [body] (breaking: predict requires every input field)");
        // a model reads at least one field, so a removed field comes with another in its place
        refused(() -> publish("b", List.of("body"), LABELS, false), StoreException.BREAKING, "removed fields [title]");
    }

    @Test
    void an_active_version_published_before_contracts_were_kept_counts_as_1_0_0() throws SQLException {
        publish("a", FIELDS, LABELS, false);
        store.activate("routing", "a", ACTOR, "");
        try (Connection c = rawConnection(); Statement s = c.createStatement()) {
            s.executeUpdate("UPDATE versions SET contract_json = NULL");
        }
        assertThat(store.version("routing", "a").orElseThrow().contract()).isEmpty();
        assertThat(publish("b", FIELDS, List.of("heating", "roofing"), true).contract().orElseThrow().version())
                .isEqualTo(new SemanticVersion(2, 0, 0));
    }
}
