package dev.pressmark.server;

import java.nio.charset.StandardCharsets;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;

/**
 * A secret that a request presents as {@code Authorization: Bearer <token>}. Only its SHA-256 is
 * kept, and a presented token is compared by digest with {@link MessageDigest#isEqual}, so the
 * time taken says nothing about how much of it matched, not even its length. {@link #toString()}
 * never shows it, so it cannot reach a log by accident.
 */
public final class BearerToken {

    private final byte[] digest;

    private BearerToken(byte[] digest) {
        this.digest = digest;
    }

    /** The token, without surrounding white space; it must not be empty or contain white space. */
    public static BearerToken of(String token) {
        String trimmed = token.strip();
        if (trimmed.isEmpty()) {
            throw new IllegalArgumentException("a token must not be empty");
        }
        for (int i = 0; i < trimmed.length(); i++) {
            if (Character.isWhitespace(trimmed.charAt(i))) {
                throw new IllegalArgumentException("a token must not contain white space (at character " + i + ")");
            }
        }
        return new BearerToken(sha256(trimmed));
    }

    boolean matches(String presented) {
        return MessageDigest.isEqual(digest, comparedDigest(presented));
    }

    /**
     * What a presented token is compared as: its SHA-256, 32 bytes whatever the token's length, so
     * the comparison always sees two arrays of one length and its time depends on nothing secret.
     */
    static byte[] comparedDigest(String presented) {
        return sha256(presented);
    }

    private static byte[] sha256(String text) {
        try {
            return MessageDigest.getInstance("SHA-256").digest(text.getBytes(StandardCharsets.UTF_8));
        } catch (NoSuchAlgorithmException e) {
            throw new IllegalStateException("every Java platform has SHA-256", e);
        }
    }

    @Override
    public String toString() {
        return "BearerToken[***]";
    }
}
