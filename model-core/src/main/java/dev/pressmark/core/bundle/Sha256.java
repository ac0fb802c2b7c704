package dev.pressmark.core.bundle;

import java.io.IOException;
import java.io.InputStream;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.util.HexFormat;

/** SHA-256 (FIPS 180-4) digests as lower-case hexadecimal, the form bundles and the store record. */
public final class Sha256 {

    /** Hex digits in a digest. */
    public static final int HEX_LENGTH = 64;

    private static final int BUFFER_BYTES = 64 * 1024;

    private Sha256() {
    }

    /** A fresh digest; every JRE is required to provide SHA-256. */
    public static MessageDigest newDigest() {
        try {
            return MessageDigest.getInstance("SHA-256");
        } catch (NoSuchAlgorithmException e) {
            throw new IllegalStateException("the JRE provides no SHA-256", e);
        }
    }

    /** The digest of {@code bytes}. */
    public static String hex(byte[] bytes) {
        return toHex(newDigest().digest(bytes));
    }

    /** The digest of everything left in {@code in}, read in small blocks; the stream is not closed. */
    public static String hex(InputStream in) throws IOException {
        MessageDigest digest = newDigest();
        byte[] buffer = new byte[BUFFER_BYTES];
        for (int n = in.read(buffer); n >= 0; n = in.read(buffer)) {
            digest.update(buffer, 0, n);
        }
        return toHex(digest.digest());
    }

    /** Lower-case hex of a finished digest. */
    public static String toHex(byte[] digest) {
        return HexFormat.of().formatHex(digest);
    }

    /** Whether {@code text} has the form of a hex digest (64 lower-case hex digits). */
    public static boolean isHex(String text) {
        if (text == null || text.length() != HEX_LENGTH) {
            return false;
        }
        for (int i = 0; i < HEX_LENGTH; i++) {
            char c = text.charAt(i);
            if (!(c >= '0' && c <= '9' || c >= 'a' && c <= 'f')) {
                return false;
            }
        }
        return true;
    }
}
