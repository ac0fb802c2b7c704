package dev.pressmark.core.sign;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.node.ObjectNode;
import dev.pressmark.core.bundle.Sha256;
import java.security.GeneralSecurityException;
import java.security.KeyPair;
import java.security.PrivateKey;
import java.security.PublicKey;
import java.security.Signature;
import java.util.Base64;
import java.util.HexFormat;
import java.util.Objects;

/**
 * The signature file ({@code BUNDLE.sig}) beside a bundle: a JSON object
 * {@code {"format":1,"algorithm":"Ed25519","key_id":"...","sha256":"<hex>","signature":"<base64>"}}.
 * The signature is Ed25519 over the 32 raw bytes of the bundle's SHA-256 digest.
 *
 * @param keyId the signing key's id ({@link SigningKeys#keyId})
 * @param sha256 the bundle's SHA-256, lower-case hex
 * @param signature the 64 signature bytes
 */
public record BundleSignature(String keyId, String sha256, byte[] signature) {

    /** The format version this program writes and the only one it reads. */
    public static final int FORMAT = 1;
    /** The file name suffix: {@code routing.pmb} is signed by {@code routing.pmb.sig}. */
    public static final String SUFFIX = ".sig";
    public static final int SIGNATURE_BYTES = 64;

    private static final ObjectMapper JSON = new ObjectMapper();

    public BundleSignature {
        Objects.requireNonNull(keyId, "keyId");
        if (!Sha256.isHex(sha256)) {
            throw new IllegalArgumentException("sha256 must be 64 lower-case hex digits, was \"" + sha256 + "\"");
        }
        if (signature.length != SIGNATURE_BYTES) {
            throw new IllegalArgumentException("signature must be " + SIGNATURE_BYTES + " bytes, was " + signature.length);
        }
        signature = signature.clone();
    }

    @Override
    public byte[] signature() {
        return signature.clone();
    }

    /** Signs the bundle whose SHA-256 is {@code sha256} (hex) with {@code keys}. */
    public static BundleSignature sign(String sha256, KeyPair keys) {
        byte[] digest = HexFormat.of().parseHex(sha256);
        return new BundleSignature(SigningKeys.keyId(keys.getPublic()), sha256, ed25519Sign(keys.getPrivate(), digest));
    }

    /** Ed25519 of {@code message} (RFC 8032 section 5.1.6). */
    public static byte[] ed25519Sign(PrivateKey key, byte[] message) {
        try {
            Signature signer = Signature.getInstance(SigningKeys.ALGORITHM);
            signer.initSign(key);
            signer.update(message);
            return signer.sign();
        } catch (GeneralSecurityException e) {
            throw new SignatureException(SignatureException.INVALID_KEY, "cannot sign with this key: " + e.getMessage(), e);
        }
    }

    /** Whether {@code signature} is a valid Ed25519 signature of {@code message} by {@code key} (RFC 8032 section 5.1.7). */
    public static boolean ed25519Verify(PublicKey key, byte[] message, byte[] signature) {
        try {
            Signature verifier = Signature.getInstance(SigningKeys.ALGORITHM);
            verifier.initVerify(key);
            verifier.update(message);
            return verifier.verify(signature);
        } catch (java.security.SignatureException e) {
            return false; // a malformed signature does not verify
        } catch (GeneralSecurityException e) {
            throw new SignatureException(SignatureException.INVALID_KEY, "cannot verify with this key: " + e.getMessage(), e);
        }
    }

    /** Whether this signs the bundle whose SHA-256 is {@code bundleSha256}, by {@code key}. */
    public boolean verifies(String bundleSha256, PublicKey key) {
        return sha256.equals(bundleSha256) && ed25519Verify(key, HexFormat.of().parseHex(sha256), signature);
    }

    public String toJson() {
        ObjectNode node = JSON.createObjectNode();
        node.put("format", FORMAT);
        node.put("algorithm", SigningKeys.ALGORITHM);
        node.put("key_id", keyId);
        node.put("sha256", sha256);
        node.put("signature", Base64.getEncoder().encodeToString(signature));
        return node.toString();
    }

    /** Reads a signature file's text; {@code source} names it in messages. */
    public static BundleSignature parse(String json, String source) {
        JsonNode node;
        try {
            node = JSON.readTree(json);
        } catch (JsonProcessingException e) {
            throw invalid(source, "not JSON: " + e.getOriginalMessage());
        }
        if (node == null || !node.isObject()) {
            throw invalid(source, "expected a JSON object");
        }
        JsonNode format = node.get("format");
        if (format == null || !format.isInt()) {
            throw invalid(source, "\"format\" must be an integer");
        }
        if (format.intValue() != FORMAT) {
            throw invalid(source, "signature format " + format.intValue() + " is not supported; this program reads format " + FORMAT);
        }
        String algorithm = text(node, "algorithm", source);
        if (!algorithm.equals(SigningKeys.ALGORITHM)) {
            throw invalid(source, "algorithm \"" + algorithm + "\" is not supported; this program reads " + SigningKeys.ALGORITHM);
        }
        String keyId = text(node, "key_id", source);
        String sha256 = text(node, "sha256", source);
        if (!Sha256.isHex(sha256)) {
            throw invalid(source, "\"sha256\" must be 64 lower-case hex digits, was \"" + sha256 + "\"");
        }
        byte[] signature;
        try {
            signature = Base64.getDecoder().decode(text(node, "signature", source));
        } catch (IllegalArgumentException e) {
            throw invalid(source, "\"signature\" is not base64: " + e.getMessage());
        }
        if (signature.length != SIGNATURE_BYTES) {
            throw invalid(source, "\"signature\" must be " + SIGNATURE_BYTES + " bytes, was " + signature.length);
        }
        return new BundleSignature(keyId, sha256, signature);
    }

    private static String text(JsonNode node, String field, String source) {
        JsonNode value = node.get(field);
        if (value == null || !value.isTextual()) {
            throw invalid(source, "\"" + field + "\" must be a string");
        }
        return value.textValue();
    }

    private static SignatureException invalid(String source, String why) {
        return new SignatureException(SignatureException.INVALID_SIGNATURE_FILE, source + ": not a bundle signature: " + why);
    }

    @Override
    public boolean equals(Object other) {
        return other instanceof BundleSignature s && keyId.equals(s.keyId) && sha256.equals(s.sha256)
                && java.util.Arrays.equals(signature, s.signature);
    }

    @Override
    public int hashCode() {
        return Objects.hash(keyId, sha256, java.util.Arrays.hashCode(signature));
    }

    @Override
    public String toString() {
        return "BundleSignature[keyId=" + keyId + ", sha256=" + sha256 + "]";
    }
}
