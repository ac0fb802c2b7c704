package dev.pressmark.store.jdbc;

import dev.pressmark.store.Activation;
import dev.pressmark.store.BundleStore;
import dev.pressmark.store.LoadedBundle;
import dev.pressmark.store.ModelSummary;
import dev.pressmark.store.PublishOptions;
import dev.pressmark.store.Shadow;
import dev.pressmark.store.ShadowReport;
import dev.pressmark.store.StoreEvent;
import dev.pressmark.store.TrustedKey;
import dev.pressmark.store.VerifyReport;
import dev.pressmark.store.Version;
import java.nio.file.Path;
import java.sql.Connection;
import java.sql.SQLException;
import java.time.Clock;
import java.time.Duration;
import java.util.List;
import java.util.Optional;

/**
 * The store over JDBC, one implementation for both databases ({@link Dialect} holds what differs),
 * handing each operation to the piece that owns its tables.
 *
 * <p>Every change is one transaction ({@link Transactions}) that first locks the model's row
 * (PostgreSQL) or takes the database's write lock at BEGIN (SQLite), so two writers of one model
 * never interleave. Reads are single statements in auto-commit mode, each seeing one consistent
 * snapshot.
 */
final class JdbcBundleStore implements BundleStore {

    private final StoreUrl url;
    private final Transactions tx;
    private final Publishing publishing;
    private final VersionRows versions;
    private final StoredBundles bundles;
    private final ActivationRows activations;
    private final ChangeFeed feed;
    private final ShadowRows shadows;
    private final KeyRows keys;
    private final EventRows events;

    private JdbcBundleStore(StoreUrl url, Transactions tx, Clock clock) {
        this.url = url;
        this.tx = tx;
        this.publishing = new Publishing(tx, clock);
        this.versions = new VersionRows(tx, clock);
        this.bundles = new StoredBundles(tx, versions);
        this.activations = new ActivationRows(tx, clock);
        this.feed = new ChangeFeed(tx);
        this.shadows = new ShadowRows(tx, clock);
        this.keys = new KeyRows(tx, clock);
        this.events = new EventRows(tx);
    }

    static JdbcBundleStore open(StoreUrl url) {
        return new JdbcBundleStore(url, new Transactions(url, StoreDatabase.open(url)), Clock.systemUTC());
    }

    @Override
    public Version publish(String model, String tag, byte[] bundle, PublishOptions options, String actor) {
        return publishing.publish(model, tag, bundle, options, actor);
    }

    @Override
    public Version publish(String model, String tag, Path bundle, PublishOptions options, String actor) {
        return publishing.publish(model, tag, bundle, options, actor);
    }

    @Override
    public Activation activate(String model, String tag, String actor, String reason) {
        return activations.activate(model, tag, ActivationRows.Expected.ANY, actor, reason);
    }

    @Override
    public Activation activate(String model, String tag, Optional<String> expectedActive, String actor, String reason) {
        return activations.activate(model, tag, ActivationRows.Expected.exactly(expectedActive), actor, reason);
    }

    @Override
    public Activation rollback(String model, String actor) {
        return activations.rollback(model, actor);
    }

    @Override
    public Version retire(String model, String tag, String actor, String reason) {
        return versions.retire(model, tag, actor, reason);
    }

    @Override
    public List<ModelSummary> models() {
        return versions.models();
    }

    @Override
    public List<Version> versions(String model) {
        return versions.versions(model);
    }

    @Override
    public Optional<Version> version(String model, String tag) {
        return versions.version(model, tag);
    }

    @Override
    public Optional<Version> activeVersion(String model) {
        return versions.activeVersion(model);
    }

    @Override
    public LoadedBundle load(String model, String tag) {
        return bundles.load(model, tag);
    }

    @Override
    public VerifyReport verify(Optional<String> model) {
        return bundles.verify(model);
    }

    @Override
    public void probe() {
        tx.read("read the store's metadata", c -> {
            ModelRows.probe(c);
            return null;
        });
    }

    @Override
    public List<Activation> activations(String model) {
        return activations.activations(model);
    }

    @Override
    public List<StoreEvent> events(String model) {
        return events.events(model);
    }

    @Override
    public long changeSequence() {
        return feed.changeSequence();
    }

    @Override
    public List<Activation> activationsSince(long sequence) {
        return feed.activationsSince(sequence);
    }

    @Override
    public long awaitChange(long sequence, Duration timeout) throws InterruptedException {
        return feed.awaitChange(sequence, timeout);
    }

    @Override
    public Shadow startShadow(String model, String tag, double fraction, String actor) {
        return shadows.start(model, tag, fraction, actor);
    }

    @Override
    public Optional<Shadow> stopShadow(String model, String actor, String reason) {
        return shadows.stop(model, actor, reason);
    }

    @Override
    public Optional<Shadow> shadow(String model) {
        return shadows.shadow(model);
    }

    @Override
    public List<Shadow> shadows() {
        return shadows.shadows();
    }

    @Override
    public void saveShadowReport(ShadowReport report) {
        shadows.saveReport(report);
    }

    @Override
    public List<ShadowReport> shadowReports(String model, Optional<String> tag) {
        return shadows.reports(model, tag);
    }

    @Override
    public TrustedKey trust(String publicKeyPem, String actor) {
        return keys.trust(publicKeyPem, actor);
    }

    @Override
    public void distrust(String keyId, String actor) {
        keys.distrust(keyId, actor);
    }

    @Override
    public List<TrustedKey> trustedKeys() {
        return keys.trustedKeys();
    }

    @Override
    public List<StoreEvent> storeEvents() {
        return events.storeEvents();
    }

    /** How many notifications the PostgreSQL listener has received; -1 on SQLite. A test seam. */
    long notificationsReceived() {
        return feed.notificationsReceived();
    }

    /** A pooled connection, configured as the store's own are. A test seam. */
    Connection rawForTests() throws SQLException {
        return tx.rawForTests();
    }

    @Override
    public String describe() {
        return url.describe();
    }

    @Override
    public void close() {
        feed.close();
        tx.close();
    }
}
