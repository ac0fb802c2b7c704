package dev.pressmark.store;

import dev.pressmark.core.PressmarkException;

/**
 * A store operation that cannot be done: bad input, a state that forbids it, or a store that
 * cannot be reached or trusted. The {@link #code()} is one of this class's constants.
 */
public final class StoreException extends PressmarkException {

    private static final long serialVersionUID = 1L;

    public static final String URL = "store-url";
    public static final String UNREACHABLE = "store-unreachable";
    public static final String NOT_A_STORE = "store-not-a-store";
    public static final String READ_ONLY = "store-read-only";
    public static final String SCHEMA_NEWER = "store-schema-newer";
    public static final String FAILURE = "store-failure";
    /** The disk (or the database's space) ran out during a write, which was rolled back. */
    public static final String STORAGE_FULL = "store-full";
    public static final String INVALID_NAME = "invalid-model-name";
    public static final String INVALID_TAG = "invalid-tag";
    public static final String NOT_A_BUNDLE = "not-a-bundle";
    /** A well-formed bundle, every checksum holding, whose contents do not load as a model. */
    public static final String UNUSABLE = "bundle-unusable";
    /** A bundle that goes past one of the declared resource limits ({@link dev.pressmark.core.bundle.BundleLimits}). */
    public static final String LIMIT = "bundle-limit";
    /** A compare-and-set activation found another version active than the one it was checked against. */
    public static final String ACTIVE_CHANGED = "active-changed";
    public static final String TAG_EXISTS = "tag-exists";
    public static final String NO_SUCH_MODEL = "no-such-model";
    public static final String NO_SUCH_VERSION = "no-such-version";
    /** The version is retired: it cannot be activated, rolled back to or shadowed. */
    public static final String RETIRED = "version-retired";
    /** A retire of a version that is retired already. */
    public static final String ALREADY_RETIRED = "already-retired";
    /** A reason that a change needs is missing or too long. */
    public static final String INVALID_REASON = "invalid-reason";
    public static final String ACTIVE = "version-active";
    public static final String NO_ROLLBACK = "no-rollback";
    public static final String CORRUPT = "version-corrupt";
    public static final String NO_ACTIVE = "no-active-version";
    public static final String SHADOW_OF_ACTIVE = "shadow-of-active";
    public static final String INVALID_FRACTION = "invalid-fraction";
    public static final String BAD_REPORT = "bad-shadow-report";
    /** The store trusts signing keys and the version carries no signature. */
    public static final String UNSIGNED = "unsigned";
    /** The signature is malformed, is for other bytes, is by a key the store does not trust, or does not verify. */
    public static final String BAD_SIGNATURE = "bad-signature";
    /** The version's contract breaks the active version's and breaking changes were not allowed. */
    public static final String BREAKING = "breaking-change";
    /** A public key file that cannot be trusted: not an Ed25519 public key. */
    public static final String INVALID_KEY = "invalid-key";
    public static final String NO_SUCH_KEY = "no-such-key";

    public StoreException(String code, String message) {
        super(code, message);
    }

    public StoreException(String code, String message, Throwable cause) {
        super(code, message, cause);
    }
}
