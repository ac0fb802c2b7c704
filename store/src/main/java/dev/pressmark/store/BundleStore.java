package dev.pressmark.store;

import java.time.Duration;
import java.util.List;
import java.util.Optional;

/**
 * The versioned bundle store. Every published bundle is kept under an immutable tag with the
 * SHA-256 of the whole file; at most one version per model is active; rolling back is one atomic
 * step; a version whose bytes no longer match their checksum is reported and never served. The
 * contract is the same on an SQLite file and on a shared PostgreSQL database.
 *
 * <p>Model names match {@value Names#MODEL_PATTERN}, tags {@value Names#TAG_PATTERN}. Every
 * failure is a {@link StoreException}; an {@code actor} is who asked (a user or a service name)
 * and goes into the audit events. {@code dev.pressmark.store.jdbc.JdbcStores} opens one by URL.
 */
public interface BundleStore extends AutoCloseable {

    /** The default store: an SQLite file in the working directory. */
    String DEFAULT_URL = "sqlite:./pressmark.db";
    /** The environment variable naming the store when no {@code --store} option is given. */
    String URL_ENV = "PRESSMARK_STORE";
    /** The environment variables a PostgreSQL URL without {@code user} or {@code password} parameters takes them from. */
    String USER_ENV = "PRESSMARK_STORE_USER";
    String PASSWORD_ENV = "PRESSMARK_STORE_PASSWORD";

    /**
     * Checks the bundle (every entry's checksum, through the bundle reader), loads it as a model
     * within {@link dev.pressmark.core.bundle.BundleLimits#DEFAULT} ({@link StoreException#UNUSABLE}
     * when it does not load, {@link StoreException#LIMIT} naming the limit it goes past), computes
     * the SHA-256 of the whole file, and stores it as {@code model}/{@code tag} in one transaction.
     * A tag that exists is refused, even with identical bytes. The version is not activated.
     */
    default Version publish(String model, String tag, byte[] bundle, String actor) {
        return publish(model, tag, bundle, PublishOptions.DEFAULT, actor);
    }

    /**
     * Publishes as {@link #publish(String, String, byte[], String)} does, with a signature and a
     * decision about breaking changes. While the store trusts at least one key, a bundle without a
     * signature is refused ({@link StoreException#UNSIGNED}), and so is one whose signature is not
     * by a trusted key over this bundle's SHA-256 ({@link StoreException#BAD_SIGNATURE}). The new
     * version's contract (input fields, labels) is compared with the active version's: a breaking
     * difference is refused ({@link StoreException#BREAKING}) unless {@code options} allow it. The
     * version records its contract version: 1.0.0 with no active version, else the active one's
     * with the major raised for a breaking change, the minor for another change.
     */
    Version publish(String model, String tag, byte[] bundle, PublishOptions options, String actor);

    /**
     * Publishes the bundle file {@code bundle} as {@link #publish(String, String, byte[], PublishOptions, String)}
     * does, without reading it into memory first: it must be a regular file within the bundle size
     * limit (checked before it is read), its SHA-256 is computed while it is read, and the stored
     * bytes are checked against that SHA-256 in the same transaction. Messages start with the path.
     */
    Version publish(String model, String tag, java.nio.file.Path bundle, PublishOptions options, String actor);

    /**
     * Makes {@code tag} the active version of {@code model}. Activating the active version again
     * changes nothing. A running shadow of the model stops: it compared a pair of versions, and
     * the pair is gone whether the candidate was promoted or another version took over.
     */
    Activation activate(String model, String tag, String actor, String reason);

    /**
     * Activates as {@link #activate(String, String, String, String)} does, but only if the active
     * version is still {@code expectedActive} (empty: none) when the transaction that writes the
     * activation reads it: a compare-and-set on the active tag. Otherwise it changes nothing and
     * fails with {@link StoreException#ACTIVE_CHANGED}, so a decision made against one active
     * version is never applied over another that some other client activated in between.
     */
    Activation activate(String model, String tag, Optional<String> expectedActive, String actor, String reason);

    /**
     * Re-activates the version that was active before the current one, appending an activation.
     * Repeated rollbacks walk back through the history; at its start this fails. A running
     * shadow stops, as on {@link #activate}. Never subject to a promotion check.
     */
    Activation rollback(String model, String actor);

    /**
     * Marks a version retired and records {@code reason} (required, see {@link Names#requiredReason})
     * in a {@link StoreEvent#RETIRE} event. A retired version stays stored, listed, readable and
     * loadable, but can no longer be activated, rolled back to or shadowed
     * ({@link StoreException#RETIRED}). The active version cannot be retired
     * ({@link StoreException#ACTIVE}), nor a retired one again ({@link StoreException#ALREADY_RETIRED}).
     * A running shadow of the version stops. Returns the version as it is now.
     */
    Version retire(String model, String tag, String actor, String reason);

    /** Every model, by name. */
    List<ModelSummary> models();

    /** A model's versions, newest first. Fails for an unknown model. */
    List<Version> versions(String model);

    /** One version's metadata. */
    Optional<Version> version(String model, String tag);

    /** The active version's metadata, if the model has one. */
    Optional<Version> activeVersion(String model);

    /**
     * Reads a version for serving: streams its stored bytes through the bundle reader and the
     * SHA-256 at once, and fails with {@link StoreException#CORRUPT} if they do not match. While
     * the store trusts keys, a version without a signature by one of them is refused as at publish.
     */
    LoadedBundle load(String model, String tag);

    /**
     * Recomputes the SHA-256 of every stored version, or of one model's when {@code model} is not
     * empty, and loads each one whose checksum matches as a model, within the default limits.
     */
    VerifyReport verify(Optional<String> model);

    /**
     * Reads every row of the store's metadata (models, versions without their bundles, activations),
     * so that damage to the pages holding them shows here: what a readiness check runs. Fails as
     * any other read does.
     */
    void probe();

    /** A model's activations, newest first. */
    List<Activation> activations(String model);

    /** A model's audit events, newest first. */
    List<StoreEvent> events(String model);

    /** The newest activation sequence number in the store, 0 when there is none: cheap to poll. */
    long changeSequence();

    /** Every activation with a sequence number above {@code sequence}, oldest first. */
    List<Activation> activationsSince(long sequence);

    /**
     * Waits until the change sequence exceeds {@code sequence} or {@code timeout} passes, and
     * returns the sequence then. PostgreSQL wakes the waiter through LISTEN/NOTIFY; both
     * databases are also polled, so a lost notification only delays the answer.
     */
    long awaitChange(long sequence, Duration timeout) throws InterruptedException;

    /**
     * Starts a shadow run of {@code tag}: from now on a {@code fraction} of the requests the
     * active version answers are also scored by {@code tag}, off the request path, on every
     * server of this store. Replaces a running shadow of the model (a new run). The tag must be
     * published, not retired and not the active version. Recorded in the events.
     */
    Shadow startShadow(String model, String tag, double fraction, String actor);

    /** Stops the model's shadow, if one runs, and records why; its reports stay. */
    Optional<Shadow> stopShadow(String model, String actor, String reason);

    /** The model's running shadow, if any. */
    Optional<Shadow> shadow(String model);

    /** Every running shadow, by model name. */
    List<Shadow> shadows();

    /** Replaces one replica's report of one shadow run with a newer snapshot. */
    void saveShadowReport(ShadowReport report);

    /**
     * Every replica's report of the model's newest shadow run, or of {@code tag}'s newest run
     * when {@code tag} is not empty; empty when there is none.
     */
    List<ShadowReport> shadowReports(String model, Optional<String> tag);

    /**
     * Trusts the Ed25519 public key in {@code publicKeyPem} (X.509 PEM) for bundle signatures, and
     * records who did. Trusting a key already trusted changes nothing and returns it.
     */
    TrustedKey trust(String publicKeyPem, String actor);

    /** Stops trusting a key. Versions it signed are then refused at load unless another trusted key signed them. */
    void distrust(String keyId, String actor);

    /** The trusted keys, by key id. */
    List<TrustedKey> trustedKeys();

    /** The audit events about the store as a whole (trusted keys), newest first. */
    List<StoreEvent> storeEvents();

    /** Where the store is, for messages: a file path or host:port/database, never a password. */
    String describe();

    @Override
    void close();
}
