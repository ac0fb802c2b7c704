package dev.pressmark.core.sign;

import dev.pressmark.core.bundle.Sha256;
import java.nio.charset.StandardCharsets;
import java.security.GeneralSecurityException;
import java.security.KeyFactory;
import java.security.KeyPair;
import java.security.KeyPairGenerator;
import java.security.PrivateKey;
import java.security.PublicKey;
import java.security.SecureRandom;
import java.security.interfaces.EdECPrivateKey;
import java.security.spec.NamedParameterSpec;
import java.security.spec.PKCS8EncodedKeySpec;
import java.security.spec.X509EncodedKeySpec;
import java.util.Arrays;
import java.util.Base64;
import java.util.Optional;

/**
 * Ed25519 key pairs through the JDK's own EdDSA provider, and their PEM text: the private key as
 * PKCS#8 ({@code PRIVATE KEY}, RFC 8410), the public key as X.509 SubjectPublicKeyInfo
 * ({@code PUBLIC KEY}), each the base64 of the JDK's encoded form between the RFC 7468 lines.
 */
public final class SigningKeys {

    public static final String ALGORITHM = "Ed25519";
    /** Bytes of a raw Ed25519 private key (the RFC 8032 seed) and of a raw public key. */
    public static final int RAW_KEY_BYTES = 32;
    /** Hex digits of a key id. */
    public static final int KEY_ID_LENGTH = 16;
    static final String PRIVATE_LABEL = "PRIVATE KEY";
    static final String PUBLIC_LABEL = "PUBLIC KEY";
    /** The fixed DER prefix of an Ed25519 SubjectPublicKeyInfo (RFC 8410 section 4) before the 32 key bytes. */
    private static final byte[] X509_PREFIX = {0x30, 0x2a, 0x30, 0x05, 0x06, 0x03, 0x2b, 0x65, 0x70, 0x03, 0x21, 0x00};

    private SigningKeys() {
    }

    /** A fresh key pair from the system's strong random source. */
    public static KeyPair generate() {
        try {
            return KeyPairGenerator.getInstance(ALGORITHM).generateKeyPair();
        } catch (GeneralSecurityException e) {
            throw new IllegalStateException("the JRE provides no Ed25519", e);
        }
    }

    /**
     * The key pair whose private key is the 32-byte RFC 8032 seed {@code seed}. The JDK derives the
     * public key only while generating, so the generator is given a source that yields the seed.
     */
    public static KeyPair fromSeed(byte[] seed) {
        if (seed.length != RAW_KEY_BYTES) {
            throw new IllegalArgumentException("seed must be " + RAW_KEY_BYTES + " bytes, was " + seed.length);
        }
        try {
            KeyPairGenerator generator = KeyPairGenerator.getInstance(ALGORITHM);
            generator.initialize(NamedParameterSpec.ED25519, new FixedBytes(seed));
            return generator.generateKeyPair();
        } catch (GeneralSecurityException e) {
            throw new IllegalStateException("the JRE provides no Ed25519", e);
        }
    }

    /** The 32 raw bytes of a public key, as RFC 8032 writes them. */
    public static byte[] rawPublicKey(PublicKey key) {
        byte[] encoded = key.getEncoded();
        if (encoded.length != X509_PREFIX.length + RAW_KEY_BYTES
                || !Arrays.equals(encoded, 0, X509_PREFIX.length, X509_PREFIX, 0, X509_PREFIX.length)) {
            throw new SignatureException(SignatureException.INVALID_KEY, "not an Ed25519 public key: " + key.getAlgorithm());
        }
        return Arrays.copyOfRange(encoded, X509_PREFIX.length, encoded.length);
    }

    /** First {@value #KEY_ID_LENGTH} hex digits of the SHA-256 of the public key's X.509 encoding: a short name for messages. */
    public static String keyId(PublicKey key) {
        return Sha256.hex(key.getEncoded()).substring(0, KEY_ID_LENGTH);
    }

    public static String privateKeyPem(PrivateKey key) {
        return pem(PRIVATE_LABEL, key.getEncoded());
    }

    public static String publicKeyPem(PublicKey key) {
        return pem(PUBLIC_LABEL, key.getEncoded());
    }

    /** Reads a PKCS#8 Ed25519 private key and derives its public half; {@code source} names the text in messages. */
    public static KeyPair readPrivateKey(String pem, String source) {
        byte[] der = unpem(pem, PRIVATE_LABEL, source);
        try {
            PrivateKey key = KeyFactory.getInstance(ALGORITHM).generatePrivate(new PKCS8EncodedKeySpec(der));
            Optional<byte[]> seed = key instanceof EdECPrivateKey ed ? ed.getBytes() : Optional.empty();
            if (seed.isEmpty() || seed.get().length != RAW_KEY_BYTES) {
                throw new SignatureException(SignatureException.INVALID_KEY, source + ": not an Ed25519 private key");
            }
            return fromSeed(seed.get());
        } catch (GeneralSecurityException e) {
            throw new SignatureException(SignatureException.INVALID_KEY, source + ": not an Ed25519 private key: " + e.getMessage(), e);
        }
    }

    /** Reads an X.509 Ed25519 public key; {@code source} names the text in messages. */
    public static PublicKey readPublicKey(String pem, String source) {
        byte[] der = unpem(pem, PUBLIC_LABEL, source);
        try {
            PublicKey key = KeyFactory.getInstance(ALGORITHM).generatePublic(new X509EncodedKeySpec(der));
            rawPublicKey(key);
            return key;
        } catch (GeneralSecurityException | SignatureException e) {
            throw new SignatureException(SignatureException.INVALID_KEY, source + ": not an Ed25519 public key: " + e.getMessage(), e);
        }
    }

    private static String pem(String label, byte[] der) {
        return "-----BEGIN " + label + "-----\n" + Base64.getMimeEncoder(64, new byte[] {'\n'}).encodeToString(der)
                + "\n-----END " + label + "-----\n";
    }

    private static byte[] unpem(String pem, String label, String source) {
        String begin = "-----BEGIN " + label + "-----";
        String end = "-----END " + label + "-----";
        int from = pem.indexOf(begin);
        int to = pem.indexOf(end);
        if (from < 0 || to < from) {
            String other = label.equals(PRIVATE_LABEL) ? PUBLIC_LABEL : PRIVATE_LABEL;
            String hint = pem.contains("-----BEGIN " + other + "-----") ? " (it holds a " + other.toLowerCase(java.util.Locale.ROOT) + ")" : "";
            throw new SignatureException(SignatureException.INVALID_KEY, source + ": expected a PEM block \"" + begin + "\"" + hint);
        }
        String body = pem.substring(from + begin.length(), to).replaceAll("\\s+", "");
        try {
            return Base64.getDecoder().decode(body.getBytes(StandardCharsets.US_ASCII));
        } catch (IllegalArgumentException e) {
            throw new SignatureException(SignatureException.INVALID_KEY, source + ": the " + label + " block is not base64: " + e.getMessage(), e);
        }
    }

    /** A random source that yields fixed bytes: how a given seed reaches the key generator. */
    private static final class FixedBytes extends SecureRandom {

        private static final long serialVersionUID = 1L;
        private final byte[] bytes;

        FixedBytes(byte[] bytes) {
            this.bytes = bytes.clone();
        }

        @Override
        public void nextBytes(byte[] out) {
            if (out.length != bytes.length) {
                throw new IllegalStateException("the key generator asked for " + out.length + " bytes, the seed has " + bytes.length);
            }
            System.arraycopy(bytes, 0, out, 0, out.length);
        }
    }
}
