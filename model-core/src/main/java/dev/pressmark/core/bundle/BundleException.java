package dev.pressmark.core.bundle;

import dev.pressmark.core.PressmarkException;

/**
 * A bundle file that cannot be read: not a bundle, damaged, tampered with, too large, or of a
 * format version this program does not know. The {@link #code()} says which; the codes are the
 * constants of this class.
 */
public final class BundleException extends PressmarkException {

    private static final long serialVersionUID = 1L;

    /** The bytes are not a well-formed bundle ZIP (truncated, not a ZIP, bad structure). */
    public static final String CORRUPT = "bundle-corrupt";
    /** An entry's bytes do not match the SHA-256, size or CRC-32 recorded for it. */
    public static final String CHECKSUM = "bundle-checksum";
    /** The manifest's {@code format_version} is not one this program reads. */
    public static final String FORMAT_VERSION = "bundle-format-version";
    /** The file or one of its entries is larger than the reader's limit. */
    public static final String TOO_LARGE = "bundle-too-large";
    /** An entry name that could escape a directory or that the format does not define. */
    public static final String ENTRY_NAME = "bundle-entry-name";
    /** The same entry twice. */
    public static final String DUPLICATE_ENTRY = "bundle-duplicate-entry";
    /** An entry the manifest does not list, or a listed entry that is absent. */
    public static final String ENTRY_MISMATCH = "bundle-entry-mismatch";
    /** The stream under the bundle failed (a disk or network error, not the bundle's content). */
    public static final String UNREADABLE = "bundle-unreadable";
    /** A well-formed bundle whose contents go past a {@link BundleLimits} limit (features, vocabulary). */
    public static final String LIMIT = "bundle-limit";
    /** The manifest is not valid JSON or lacks a required field. */
    public static final String MANIFEST = "bundle-manifest";

    public BundleException(String code, String message) {
        super(code, message);
    }

    public BundleException(String code, String message, Throwable cause) {
        super(code, message, cause);
    }
}
