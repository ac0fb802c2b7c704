package dev.pressmark.server;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.databind.JsonNode;
import dev.pressmark.core.sign.BundleSignature;
import dev.pressmark.core.sign.SigningKeys;
import dev.pressmark.store.PublishOptions;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.security.KeyPair;
import java.security.MessageDigest;
import java.time.Duration;
import java.util.Base64;
import java.util.HexFormat;
import java.util.Optional;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** Signed publishing, contract checks and load-time refusal through a real server on a loopback port. */
class SignedPublishServedTest {

    private static final String ONE_ITEM = "{\"items\":[{\"title\":\"voltamp outlet pro\"}]}";
    private static final Duration WAIT = Duration.ofSeconds(6);
    private static final KeyPair KEYS = SigningKeys.generate();

    private static final byte[] first = TestBundles.svm();
    private static final byte[] second = TestBundles.logistic();

    @TempDir
    Path dir;

    private static String sha256(byte[] bytes) throws Exception {
        // the JDK's digest, independent of the project's helper
        return HexFormat.of().formatHex(MessageDigest.getInstance("SHA-256").digest(bytes));
    }

    /** The header value: the signature file's JSON in base64url (RFC 4648 section 5), as the JDK's encoder writes it. */
    private static String header(byte[] bundle, KeyPair keys) throws Exception {
        String json = BundleSignature.sign(sha256(bundle), keys).toJson();
        return Base64.getUrlEncoder().withoutPadding().encodeToString(json.getBytes(StandardCharsets.UTF_8));
    }

    private static Http.Answer put(Served s, String path, byte[] bundle, String... extraHeaders) {
        String[] headers = new String[Served.AS_ADMIN.length + extraHeaders.length];
        System.arraycopy(Served.AS_ADMIN, 0, headers, 0, Served.AS_ADMIN.length);
        System.arraycopy(extraHeaders, 0, headers, Served.AS_ADMIN.length, extraHeaders.length);
        return s.http.put(path, "application/octet-stream", bundle, headers);
    }

    @Test
    void with_a_trusted_key_only_bundles_signed_by_it_are_published_over_http() throws Exception {
        try (Served s = Served.on(dir)) {
            s.store.trust(SigningKeys.publicKeyPem(KEYS.getPublic()), "test");
            Http.Answer unsigned = put(s, "/models/routing/versions/1.0.0", first);
            assertThat(unsigned.status()).as(unsigned.body()).isEqualTo(422);
            assertThat(unsigned.contentType()).startsWith("application/problem+json");
            assertThat(unsigned.json().get("type").asText()).isEqualTo("urn:pressmark:problem:unsigned");
            assertThat(unsigned.json().get("detail").asText()).contains(SigningKeys.keyId(KEYS.getPublic()));

            Http.Answer tampered = put(s, "/models/routing/versions/1.0.0", second, "Pressmark-Signature", header(first, KEYS));
            assertThat(tampered.status()).as(tampered.body()).isEqualTo(422);
            assertThat(tampered.json().get("type").asText()).isEqualTo("urn:pressmark:problem:bad-signature");

            Http.Answer foreign = put(s, "/models/routing/versions/1.0.0", first, "Pressmark-Signature", header(first, SigningKeys.generate()));
            assertThat(foreign.status()).isEqualTo(422);
            assertThat(foreign.json().get("detail").asText()).contains("which this store does not trust");

            Http.Answer garbled = put(s, "/models/routing/versions/1.0.0", first, "Pressmark-Signature", "not*base64");
            assertThat(garbled.status()).isEqualTo(400);
            assertThat(garbled.json().at("/errors/0/field").asText()).isEqualTo("Pressmark-Signature");

            Http.Answer signed = put(s, "/models/routing/versions/1.0.0", first, "Pressmark-Signature", header(first, KEYS));
            assertThat(signed.status()).as(signed.body()).isEqualTo(201);
            assertThat(signed.json().get("signed_by").asText()).isEqualTo(SigningKeys.keyId(KEYS.getPublic()));
            assertThat(signed.json().get("contract_version").asText()).isEqualTo("1.0.0");
            assertThat(s.store.versions("routing")).hasSize(1);
        }
    }

    @Test
    void a_version_that_no_trusted_key_signed_is_not_loaded_and_the_old_one_keeps_serving() throws Exception {
        try (Served s = Served.on(dir)) {
            s.store.publish("routing", "1.0.0", first, new PublishOptions(Optional.of(BundleSignature.sign(sha256(first), KEYS).toJson()), false),
                    "test");
            s.store.publish("routing", "1.1.0", second, "test");
            s.store.activate("routing", "1.0.0", "test", "first");
            assertThat(s.servedVersion()).isEqualTo("1.0.0");
            s.store.trust(SigningKeys.publicKeyPem(KEYS.getPublic()), "test");

            // this server cannot load it, so it does not make it active
            Http.Answer refused = s.http.putJson("/models/routing/active", "{\"tag\":\"1.1.0\"}", Served.AS_ADMIN);
            assertThat(refused.status()).as(refused.body()).isEqualTo(422);
            assertThat(refused.json().get("type").asText()).isEqualTo("urn:pressmark:problem:unsigned");
            assertThat(s.store.activeVersion("routing").orElseThrow().tag()).isEqualTo("1.0.0");
            // activated all the same by a client that does not load what it activates (a program older than this check)
            s.store.activate("routing", "1.1.0", "test", "older client");
            s.server.live().refresh("routing");
            JsonNode ready = s.http.get("/health/ready").json();
            assertThat(ready.at("/models/routing/failed_tag").asText()).isEqualTo("1.1.0");
            assertThat(ready.at("/models/routing/error").asText()).contains("unsigned");
            assertThat(s.servedVersion()).isEqualTo("1.0.0");
            Http.Answer named = s.http.postJson("/models/routing/versions/1.1.0/predict", ONE_ITEM);
            assertThat(named.status()).as(named.body()).isEqualTo(422);
            assertThat(named.json().get("type").asText()).isEqualTo("urn:pressmark:problem:unsigned");
        }
    }

    @Test
    void a_breaking_bundle_is_refused_unless_allowed_and_the_contract_versions_reach_the_listing_and_the_document() throws Exception {
        try (Served s = Served.on(dir)) {
            assertThat(put(s, "/models/routing/versions/1", first).status()).isEqualTo(201);
            s.http.putJson("/models/routing/active", "{\"tag\":\"1\"}", Served.AS_ADMIN);
            assertThat(s.http.get("/openapi.json").json().at("/info/version").asText()).isEqualTo("1.0.0");

            // a model of another field and other labels: every field and label of the active one removed
            byte[] bare = TestBundles.otherContract();
            Http.Answer refused = put(s, "/models/routing/versions/2", bare);
            assertThat(refused.status()).as(refused.body()).isEqualTo(409);
            assertThat(refused.json().get("type").asText()).isEqualTo("urn:pressmark:problem:breaking-change");
            assertThat(refused.json().get("detail").asText())
                    .contains("removed fields [title]", "removed labels [electrical, garden, plumbing]", "allow_breaking=true");
            assertThat(put(s, "/models/routing/versions/2?allow_breaking=maybe", bare).status()).isEqualTo(400);

            Http.Answer allowed = put(s, "/models/routing/versions/2?allow_breaking=true", bare);
            assertThat(allowed.status()).as(allowed.body()).isEqualTo(201);
            assertThat(allowed.json().at("/contract/version").asText()).isEqualTo("2.0.0");
            assertThat(allowed.json().at("/contract/against").asText()).isEqualTo("1");
            assertThat(allowed.json().at("/contract/diff/breaking").asBoolean()).isTrue();
            s.store.activate("routing", "2", "test", "bare");
            // against the bare version, the trained one adds the field and the labels: breaking again, so contract 3.0.0
            assertThat(put(s, "/models/routing/versions/3?allow_breaking=true", second).json().at("/contract/version").asText()).isEqualTo("3.0.0");
            Http.Answer activated = s.http.putJson("/models/routing/active", "{\"tag\":\"3\"}", Served.AS_ADMIN);
            assertThat(activated.json().get("serving").asText()).isEqualTo("3");

            JsonNode listed = s.http.get("/models/routing/versions").json().get("versions");
            assertThat(listed.findValuesAsText("contract_version")).containsExactly("3.0.0", "2.0.0", "1.0.0");
            JsonNode info = s.http.get("/openapi.json").json().get("info");
            assertThat(info.get("version").asText()).isEqualTo("3.0.0");
            assertThat(info.get("description").asText()).contains("routing 3 (contract 3.0.0)");
        }
    }
}
