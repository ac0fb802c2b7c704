package dev.pressmark.store;

import com.zaxxer.hikari.HikariDataSource;
import dev.pressmark.core.bundle.BundleArchive;
import dev.pressmark.core.bundle.BundleContents;
import dev.pressmark.core.bundle.BundleException;
import dev.pressmark.core.bundle.Sha256;
import dev.pressmark.core.contract.Contract;
import dev.pressmark.core.contract.ContractRecord;
import dev.pressmark.core.contract.SemanticVersion;
import dev.pressmark.core.sign.BundleSignature;
import java.io.IOException;
import java.io.FilterInputStream;
import java.io.InputStream;
import java.io.OutputStream;
import java.nio.file.Path;
import java.security.DigestInputStream;
import java.security.MessageDigest;
import java.sql.Connection;
import java.sql.PreparedStatement;
import java.sql.ResultSet;
import java.sql.SQLException;
import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Objects;
import java.util.Optional;
import java.util.Set;

/**
 * The store over JDBC, one implementation for both databases; {@link Dialect} holds what differs.
 *
 * <p>Every change is one transaction that first locks the model's row (PostgreSQL) or takes the
 * database's write lock at BEGIN (SQLite), so two writers of one model never interleave. Reads
 * are single statements in auto-commit mode, each seeing one consistent snapshot.
 *
 * <p>Rollback keeps a stack in the activation rows: each row's {@code parent_seq} is the row it
 * replaced. An activation pushes (parent = the current row); a rollback pops (it re-activates the
 * parent's version and takes the parent's own parent), so repeated rollbacks walk back through
 * what was active, and an activation after a rollback starts a new branch.
 */
final class JdbcBundleStore implements BundleStore {

    /** How often {@link #awaitChange} polls the sequence when no notification arrives: 500 ms. */
    static final long POLL_INTERVAL_MS = 500;
    static final String NOTIFY_CHANNEL = "pressmark_activations";
    /** SQLSTATEs of a PostgreSQL server that ends or refuses connections because it is stopping, crashing or starting. */
    private static final Set<String> SERVER_GOING_AWAY = Set.of("57P01", "57P02", "57P03");

    private final StoreUrl url;
    private final HikariDataSource pool;
    private final Clock clock;
    private final PostgresListener listener;

    private JdbcBundleStore(StoreUrl url, HikariDataSource pool, Clock clock) {
        this.url = url;
        this.pool = pool;
        this.clock = clock;
        this.listener = url.dialect() == Dialect.POSTGRESQL ? new PostgresListener(url, NOTIFY_CHANNEL) : null;
    }

    static JdbcBundleStore open(StoreUrl url) {
        return new JdbcBundleStore(url, StoreDatabase.open(url), Clock.systemUTC());
    }

    @Override
    public Version publish(String model, String tag, byte[] bundle, PublishOptions options, String actor) {
        Objects.requireNonNull(bundle, "bundle");
        checkPublish(model, tag, options, actor);
        BundleContents contents;
        try {
            contents = BundleArchive.read(bundle);
        } catch (BundleException e) {
            throw BundleCheck.notABundle(e, "");
        }
        BundleCheck.load(contents, model, tag, "cannot publish ");
        return insert(model, tag, contents, Sha256.hex(bundle), bundle.length, new BundleBytes() {
            @Override
            public void bind(PreparedStatement statement, int index) throws SQLException {
                statement.setBytes(index, bundle);
            }
        }, options, actor);
    }

    @Override
    public Version publish(String model, String tag, Path bundle, PublishOptions options, String actor) {
        Objects.requireNonNull(bundle, "bundle");
        checkPublish(model, tag, options, actor);
        long size = BundleFile.size(bundle);
        MessageDigest digest = Sha256.newDigest();
        BundleContents contents = BundleFile.read(bundle, digest);
        BundleCheck.load(contents, model, tag, "cannot publish ");
        String sha256 = Sha256.toHex(digest.digest());
        try (BundleFile.Stored stored = new BundleFile.Stored(bundle, size, sha256)) {
            return insert(model, tag, contents, sha256, size, stored, options, actor);
        }
    }

    private static void checkPublish(String model, String tag, PublishOptions options, String actor) {
        Objects.requireNonNull(options, "options");
        Names.model(model);
        Names.tag(tag);
        Names.actor(actor);
    }

    /** The bundle's bytes as the publishing transaction stores them. */
    interface BundleBytes {
        /** Sets the statement parameter that holds the bytes. */
        void bind(PreparedStatement statement, int index) throws SQLException;

        /** After the statement ran: fails the transaction if what it stored is not what was checked. */
        default void verify() {
        }
    }

    /** Stores a checked bundle in one transaction. */
    private Version insert(String model, String tag, BundleContents contents, String sha256, long size, BundleBytes bytes, PublishOptions options,
            String actor) {
        String manifest = contents.manifestJson();
        long now = now();
        return write("publish " + model + " " + tag, c -> {
            try (PreparedStatement insert = c.prepareStatement("INSERT INTO models (name, created_at) VALUES (?, ?) ON CONFLICT (name) DO NOTHING")) {
                insert.setString(1, model);
                insert.setLong(2, now);
                insert.executeUpdate();
            }
            lockModel(c, model);
            if (versionRow(c, model, tag) != null) {
                throw new StoreException(StoreException.TAG_EXISTS, model + " " + tag + " is already published; a published tag is immutable,"
                        + " so publish under a new tag");
            }
            Signatures.check(options.signatureJson(), sha256, Signatures.trustedKeys(c), "cannot publish " + model + " " + tag);
            ContractRecord contract = contract(c, model, tag, contents, options.allowBreaking());
            String contractJson = contract.toJson();
            try (PreparedStatement insert = c.prepareStatement("INSERT INTO versions (model, tag, sha256, size, created_at, manifest_json, bundle,"
                    + " signature_json, contract_json) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?)")) {
                insert.setString(1, model);
                insert.setString(2, tag);
                insert.setString(3, sha256);
                insert.setLong(4, size);
                insert.setLong(5, now);
                insert.setString(6, manifest);
                bytes.bind(insert, 7);
                insert.setString(8, options.signatureJson().orElse(null));
                insert.setString(9, contractJson);
                insert.executeUpdate();
                bytes.verify();
            }
            String signedBy = options.signatureJson().map(json -> ", signed by key " + BundleSignature.parse(json, "the signature").keyId())
                    .orElse("");
            event(c, now, actor, StoreEvent.PUBLISH, model, tag, "sha256 " + sha256 + ", " + size + " bytes" + signedBy
                    + ", contract " + contract.version() + contract.against().map(a -> " (" + contract.diff().describe() + " against " + a + ")")
                    .orElse(""));
            return new Version(model, tag, sha256, size, Instant.ofEpochMilli(now), manifest, false, false, options.signatureJson(),
                    Optional.of(contractJson));
        });
    }

    /**
     * The new version's contract record against the active version. A version published before the
     * store kept contract records counts as contract 1.0.0.
     */
    private static ContractRecord contract(Connection c, String model, String tag, BundleContents contents, boolean allowBreaking)
            throws SQLException {
        Activation current = currentActivation(c, model);
        if (current == null) {
            return ContractRecord.first();
        }
        String activeManifest;
        String activeContract;
        try (PreparedStatement select = c.prepareStatement("SELECT manifest_json, contract_json FROM versions WHERE model = ? AND tag = ?")) {
            select.setString(1, model);
            select.setString(2, current.tag());
            try (ResultSet rs = select.executeQuery()) {
                rs.next();
                activeManifest = rs.getString(1);
                activeContract = rs.getString(2);
            }
        }
        SemanticVersion activeVersion = activeContract == null ? SemanticVersion.FIRST : ContractRecord.parse(activeContract).version();
        ContractRecord record = ContractRecord.against(current.tag(), Contract.ofManifestJson(activeManifest), activeVersion,
                Contract.of(contents.manifest()));
        if (record.diff().breaking() && !allowBreaking) {
            throw new StoreException(StoreException.BREAKING, "cannot publish " + model + " " + tag + ": it breaks the contract of the active"
                    + " version " + current.tag() + " (" + activeVersion + "): " + record.diff().describe()
                    + "; allow breaking changes to publish it as contract " + record.version());
        }
        return record;
    }

    @Override
    public TrustedKey trust(String publicKeyPem, String actor) {
        Objects.requireNonNull(publicKeyPem, "publicKeyPem");
        Names.actor(actor);
        String keyId = Signatures.keyId(publicKeyPem);
        long now = now();
        return write("trust key " + keyId, c -> {
            for (TrustedKey key : Signatures.trustedKeys(c)) {
                if (key.keyId().equals(keyId)) {
                    return key;
                }
            }
            try (PreparedStatement insert = c.prepareStatement("INSERT INTO trusted_keys (key_id, public_key_pem, added_at, actor) VALUES (?, ?, ?, ?)")) {
                insert.setString(1, keyId);
                insert.setString(2, publicKeyPem);
                insert.setLong(3, now);
                insert.setString(4, actor);
                insert.executeUpdate();
            }
            event(c, now, actor, StoreEvent.TRUST, StoreEvent.STORE_WIDE, keyId, "trusted Ed25519 key " + keyId);
            return new TrustedKey(keyId, publicKeyPem, Instant.ofEpochMilli(now), actor);
        });
    }

    @Override
    public void distrust(String keyId, String actor) {
        Objects.requireNonNull(keyId, "keyId");
        Names.actor(actor);
        long now = now();
        write("stop trusting key " + keyId, c -> {
            int removed;
            try (PreparedStatement delete = c.prepareStatement("DELETE FROM trusted_keys WHERE key_id = ?")) {
                delete.setString(1, keyId);
                removed = delete.executeUpdate();
            }
            if (removed == 0) {
                throw new StoreException(StoreException.NO_SUCH_KEY, "no trusted key " + keyId + "; trusted keys: "
                        + Signatures.trustedKeys(c).stream().map(TrustedKey::keyId).toList());
            }
            event(c, now, actor, StoreEvent.DISTRUST, StoreEvent.STORE_WIDE, keyId, "stopped trusting key " + keyId);
            return null;
        });
    }

    @Override
    public List<TrustedKey> trustedKeys() {
        return read("list the trusted keys", Signatures::trustedKeys);
    }

    @Override
    public List<StoreEvent> storeEvents() {
        return read("read the store's events", c -> eventList(c, StoreEvent.STORE_WIDE));
    }

    @Override
    public Activation activate(String model, String tag, String actor, String reason) {
        return activate(model, tag, Expected.ANY, actor, reason);
    }

    @Override
    public Activation activate(String model, String tag, Optional<String> expectedActive, String actor, String reason) {
        Objects.requireNonNull(expectedActive, "expectedActive");
        return activate(model, tag, new Expected(false, expectedActive), actor, reason);
    }

    /** What an activation expects to replace: any version, or exactly the active tag {@code tag} (empty: none active). */
    private record Expected(boolean any, Optional<String> tag) {
        static final Expected ANY = new Expected(true, Optional.empty());

        boolean matches(Activation current) {
            return any || tag.equals(Optional.ofNullable(current).map(Activation::tag));
        }
    }

    private Activation activate(String model, String tag, Expected expected, String actor, String reason) {
        Names.model(model);
        Names.tag(tag);
        Names.actor(actor);
        String why = reason == null ? "" : reason;
        long now = now();
        return write("activate " + model + " " + tag, c -> {
            lockModel(c, model);
            VersionRow version = versionRow(c, model, tag);
            if (version == null) {
                throw noSuchVersion(model, tag);
            }
            if (version.retired()) {
                throw new StoreException(StoreException.RETIRED, model + " " + tag + " is retired and cannot be activated");
            }
            Activation current = currentActivation(c, model);
            if (!expected.matches(current)) {
                throw new StoreException(StoreException.ACTIVE_CHANGED, "cannot activate " + model + " " + tag + ": the active version changed from "
                        + expected.tag().orElse("none") + " to " + (current == null ? "none" : current.tag()) + " since it was checked; check again");
            }
            if (current != null && current.tag().equals(tag)) {
                return current;
            }
            Activation added = appendActivation(c, model, tag, now, actor, why, false, current == null ? null : current.sequence());
            event(c, now, actor, StoreEvent.ACTIVATE, model, tag, (current == null ? "first activation" : "replaces " + current.tag())
                    + (why.isEmpty() ? "" : "; " + why));
            endShadow(c, model, now, actor, "the active version changed to " + tag);
            return added;
        });
    }

    @Override
    public Activation rollback(String model, String actor) {
        Names.model(model);
        Names.actor(actor);
        long now = now();
        return write("roll back " + model, c -> {
            lockModel(c, model);
            Activation current = currentActivation(c, model);
            if (current == null) {
                throw new StoreException(StoreException.NO_ROLLBACK, model + " has never been activated; there is nothing to roll back");
            }
            Long parentSeq = parentOf(c, current.sequence());
            if (parentSeq == null) {
                throw new StoreException(StoreException.NO_ROLLBACK, "cannot roll back " + model + ": " + current.tag()
                        + " is the start of its activation history; nothing was active before it");
            }
            Activation parent = activation(c, parentSeq);
            VersionRow version = versionRow(c, model, parent.tag());
            if (version.retired()) {
                throw new StoreException(StoreException.RETIRED, "cannot roll back " + model + " to " + parent.tag() + ": it is retired");
            }
            Activation added = appendActivation(c, model, parent.tag(), now, actor, "rollback from " + current.tag(), true,
                    parentOf(c, parentSeq));
            event(c, now, actor, StoreEvent.ROLLBACK, model, parent.tag(), "rolled back from " + current.tag());
            endShadow(c, model, now, actor, "rolled back to " + parent.tag());
            return added;
        });
    }

    @Override
    public void retire(String model, String tag, String actor) {
        Names.model(model);
        Names.tag(tag);
        Names.actor(actor);
        long now = now();
        write("retire " + model + " " + tag, c -> {
            lockModel(c, model);
            VersionRow version = versionRow(c, model, tag);
            if (version == null) {
                throw noSuchVersion(model, tag);
            }
            Activation current = currentActivation(c, model);
            if (current != null && current.tag().equals(tag)) {
                throw new StoreException(StoreException.ACTIVE, model + " " + tag + " is the active version and cannot be retired;"
                        + " activate another version first");
            }
            if (version.retired()) {
                return null;
            }
            try (PreparedStatement update = c.prepareStatement("UPDATE versions SET retired_at = ? WHERE id = ?")) {
                update.setLong(1, now);
                update.setLong(2, version.id());
                update.executeUpdate();
            }
            event(c, now, actor, StoreEvent.RETIRE, model, tag, "");
            return null;
        });
    }

    @Override
    public List<ModelSummary> models() {
        return read("list models", c -> {
            List<ModelSummary> models = new ArrayList<>();
            try (PreparedStatement select = c.prepareStatement("SELECT m.name, m.created_at,"
                    + " (SELECT a.tag FROM activations a WHERE a.model = m.name ORDER BY a.seq DESC LIMIT 1),"
                    + " (SELECT COUNT(*) FROM versions v WHERE v.model = m.name)"
                    + " FROM models m ORDER BY m.name");
                    ResultSet rs = select.executeQuery()) {
                while (rs.next()) {
                    models.add(new ModelSummary(rs.getString(1), Instant.ofEpochMilli(rs.getLong(2)), Optional.ofNullable(rs.getString(3)),
                            rs.getInt(4)));
                }
            }
            return models;
        });
    }

    private static final String VERSION_COLUMNS = "v.model, v.tag, v.sha256, v.size, v.created_at, v.manifest_json,"
            + " CASE WHEN v.tag = (SELECT a.tag FROM activations a WHERE a.model = v.model ORDER BY a.seq DESC LIMIT 1) THEN 1 ELSE 0 END,"
            + " CASE WHEN v.retired_at IS NULL THEN 0 ELSE 1 END, v.signature_json, v.contract_json";

    @Override
    public List<Version> versions(String model) {
        Names.model(model);
        return read("list versions of " + model, c -> {
            requireModel(c, model);
            List<Version> versions = new ArrayList<>();
            try (PreparedStatement select = c.prepareStatement("SELECT " + VERSION_COLUMNS + " FROM versions v WHERE v.model = ? ORDER BY v.id DESC")) {
                select.setString(1, model);
                try (ResultSet rs = select.executeQuery()) {
                    while (rs.next()) {
                        versions.add(version(rs));
                    }
                }
            }
            return versions;
        });
    }

    @Override
    public Optional<Version> version(String model, String tag) {
        Names.model(model);
        Names.tag(tag);
        return read("read " + model + " " + tag, c -> {
            try (PreparedStatement select = c.prepareStatement("SELECT " + VERSION_COLUMNS + " FROM versions v WHERE v.model = ? AND v.tag = ?")) {
                select.setString(1, model);
                select.setString(2, tag);
                try (ResultSet rs = select.executeQuery()) {
                    return rs.next() ? Optional.of(version(rs)) : Optional.empty();
                }
            }
        });
    }

    @Override
    public Optional<Version> activeVersion(String model) {
        Names.model(model);
        return read("read the active version of " + model, c -> {
            try (PreparedStatement select = c.prepareStatement("SELECT " + VERSION_COLUMNS + " FROM versions v WHERE v.model = ? AND v.tag ="
                    + " (SELECT a.tag FROM activations a WHERE a.model = ? ORDER BY a.seq DESC LIMIT 1)")) {
                select.setString(1, model);
                select.setString(2, model);
                try (ResultSet rs = select.executeQuery()) {
                    return rs.next() ? Optional.of(version(rs)) : Optional.empty();
                }
            }
        });
    }

    @Override
    public LoadedBundle load(String model, String tag) {
        Version version = version(model, tag).orElseThrow(() -> noSuchVersion(model, tag));
        return read("load " + model + " " + tag, c -> {
            Signatures.check(version.signatureJson(), version.sha256(), Signatures.trustedKeys(c), model + " " + tag + " will not be served");
            try (PreparedStatement select = c.prepareStatement("SELECT bundle FROM versions WHERE model = ? AND tag = ?")) {
                select.setString(1, model);
                select.setString(2, tag);
                try (ResultSet rs = select.executeQuery()) {
                    if (!rs.next()) {
                        throw noSuchVersion(model, tag);
                    }
                    MessageDigest digest = Sha256.newDigest();
                    BundleContents contents;
                    try (InputStream in = new DigestInputStream(rs.getBinaryStream(1), digest)) {
                        contents = BundleArchive.read(in);
                    } catch (BundleException e) {
                        throw corrupt(version, "its stored bytes are not a valid bundle (" + e.getMessage() + ")", e);
                    } catch (IOException e) {
                        throw new StoreException(StoreException.FAILURE, "cannot read " + model + " " + tag + ": " + e.getMessage(), e);
                    }
                    String actual = Sha256.toHex(digest.digest());
                    if (!actual.equals(version.sha256())) {
                        throw corrupt(version, "its stored bytes have SHA-256 " + actual + ", recorded " + version.sha256(), null);
                    }
                    return new LoadedBundle(version, contents);
                }
            }
        });
    }

    private static StoreException corrupt(Version version, String why, Throwable cause) {
        return new StoreException(StoreException.CORRUPT, version.model() + " " + version.tag() + " is corrupt and will not be served: " + why, cause);
    }

    private record Stored(long id, String model, String tag, String sha256, long size) {
    }

    @Override
    public VerifyReport verify(Optional<String> model) {
        model.ifPresent(Names::model);
        return read("verify", c -> {
            if (model.isPresent()) {
                requireModel(c, model.get());
            }
            List<Stored> stored = new ArrayList<>();
            try (PreparedStatement select = c.prepareStatement("SELECT id, model, tag, sha256, size FROM versions"
                    + (model.isPresent() ? " WHERE model = ?" : "") + " ORDER BY model, id")) {
                if (model.isPresent()) {
                    select.setString(1, model.get());
                }
                try (ResultSet rs = select.executeQuery()) {
                    while (rs.next()) {
                        stored.add(new Stored(rs.getLong(1), rs.getString(2), rs.getString(3), rs.getString(4), rs.getLong(5)));
                    }
                }
            }
            List<VerifyReport.Mismatch> mismatches = new ArrayList<>();
            List<VerifyReport.Unusable> unusable = new ArrayList<>();
            // one bundle at a time, so that memory holds at most one of them
            try (PreparedStatement select = c.prepareStatement("SELECT bundle FROM versions WHERE id = ?")) {
                for (Stored version : stored) {
                    select.setLong(1, version.id());
                    try (ResultSet rs = select.executeQuery()) {
                        if (!rs.next()) {
                            continue; // cannot happen: versions are never deleted
                        }
                        verifyOne(version, rs.getBinaryStream(1), mismatches, unusable);
                    }
                }
            }
            return new VerifyReport(stored.size(), mismatches, unusable);
        });
    }

    /**
     * Streams one stored bundle through the SHA-256 and the bundle reader at once, then loads what
     * the reader gave as a model; a checksum mismatch is reported alone, since it explains any
     * failure to load.
     */
    private static void verifyOne(Stored version, InputStream stored, List<VerifyReport.Mismatch> mismatches, List<VerifyReport.Unusable> unusable) {
        MessageDigest digest = Sha256.newDigest();
        CountingInputStream counted = new CountingInputStream(new DigestInputStream(stored, digest));
        BundleContents contents = null;
        String unreadable = null;
        try (InputStream in = counted) {
            try {
                contents = BundleArchive.read(in);
            } catch (BundleException e) {
                unreadable = e.getMessage();
            }
            in.transferTo(OutputStream.nullOutputStream()); // the rest, for the checksum
        } catch (IOException e) {
            throw new StoreException(StoreException.FAILURE, "cannot read " + version.model() + " " + version.tag() + ": " + e.getMessage(), e);
        }
        String actual = Sha256.toHex(digest.digest());
        if (!actual.equals(version.sha256()) || counted.count() != version.size()) {
            mismatches.add(new VerifyReport.Mismatch(version.model(), version.tag(), version.sha256(), actual, version.size(), counted.count()));
            return;
        }
        if (unreadable != null) {
            unusable.add(new VerifyReport.Unusable(version.model(), version.tag(), unreadable));
            return;
        }
        try {
            BundleCheck.load(contents, version.model(), version.tag(), "");
        } catch (StoreException e) {
            String prefix = version.model() + " " + version.tag() + ": ";
            unusable.add(new VerifyReport.Unusable(version.model(), version.tag(),
                    e.getMessage().startsWith(prefix) ? e.getMessage().substring(prefix.length()) : e.getMessage()));
        }
    }

    @Override
    public void probe() {
        read("read the store's metadata", c -> {
            // LENGTH makes each database read every value it measures: a damaged page under any row fails here
            for (String sql : List.of("SELECT COUNT(*), SUM(LENGTH(name)) FROM models",
                    "SELECT COUNT(*), SUM(LENGTH(model) + LENGTH(tag) + LENGTH(sha256) + LENGTH(manifest_json)"
                            + " + COALESCE(LENGTH(signature_json), 0) + COALESCE(LENGTH(contract_json), 0)) FROM versions",
                    "SELECT COUNT(*), SUM(LENGTH(model) + LENGTH(tag) + LENGTH(reason)) FROM activations")) {
                try (PreparedStatement select = c.prepareStatement(sql); ResultSet rs = select.executeQuery()) {
                    rs.next();
                }
            }
            return null;
        });
    }

    private static final String ACTIVATION_COLUMNS = "seq, model, tag, activated_at, actor, reason, is_rollback";

    @Override
    public List<Activation> activations(String model) {
        Names.model(model);
        return read("read the activations of " + model, c -> {
            requireModel(c, model);
            try (PreparedStatement select = c.prepareStatement("SELECT " + ACTIVATION_COLUMNS + " FROM activations WHERE model = ? ORDER BY seq DESC")) {
                select.setString(1, model);
                return activationList(select);
            }
        });
    }

    @Override
    public List<StoreEvent> events(String model) {
        Names.model(model);
        return read("read the events of " + model, c -> {
            requireModel(c, model);
            return eventList(c, model);
        });
    }

    private static List<StoreEvent> eventList(Connection c, String model) throws SQLException {
        List<StoreEvent> events = new ArrayList<>();
        try (PreparedStatement select = c.prepareStatement("SELECT id, at, actor, action, model, tag, detail FROM events WHERE model = ? ORDER BY id DESC")) {
            select.setString(1, model);
            try (ResultSet rs = select.executeQuery()) {
                while (rs.next()) {
                    events.add(new StoreEvent(rs.getLong(1), Instant.ofEpochMilli(rs.getLong(2)), rs.getString(3), rs.getString(4),
                            rs.getString(5), rs.getString(6), rs.getString(7)));
                }
            }
        }
        return events;
    }

    @Override
    public long changeSequence() {
        return read("read the change sequence", JdbcBundleStore::changeSequence);
    }

    private static long changeSequence(Connection c) throws SQLException {
        try (PreparedStatement select = c.prepareStatement("SELECT COALESCE(MAX(seq), 0) FROM activations");
                ResultSet rs = select.executeQuery()) {
            rs.next();
            return rs.getLong(1);
        }
    }

    @Override
    public List<Activation> activationsSince(long sequence) {
        return read("read the activations since " + sequence, c -> {
            try (PreparedStatement select = c.prepareStatement("SELECT " + ACTIVATION_COLUMNS + " FROM activations WHERE seq > ? ORDER BY seq")) {
                select.setLong(1, sequence);
                return activationList(select);
            }
        });
    }

    @Override
    public long awaitChange(long sequence, Duration timeout) throws InterruptedException {
        long deadline = System.nanoTime() + timeout.toNanos();
        while (true) {
            long seen = listener == null ? 0 : listener.notifications();
            long current = changeSequence();
            long remainingMs = (deadline - System.nanoTime()) / 1_000_000;
            if (current > sequence || remainingMs <= 0) {
                return current;
            }
            long waitMs = Math.min(remainingMs, POLL_INTERVAL_MS);
            if (listener != null) {
                listener.awaitNotificationAfter(seen, waitMs);
            } else {
                Thread.sleep(waitMs);
            }
        }
    }

    @Override
    public Shadow startShadow(String model, String tag, double fraction, String actor) {
        Names.model(model);
        Names.tag(tag);
        Names.actor(actor);
        Shadow.checkFraction(fraction);
        long now = now();
        return write("start a shadow of " + model + " " + tag, c -> {
            lockModel(c, model);
            VersionRow version = versionRow(c, model, tag);
            if (version == null) {
                throw noSuchVersion(model, tag);
            }
            if (version.retired()) {
                throw new StoreException(StoreException.RETIRED, model + " " + tag + " is retired and cannot be shadowed");
            }
            Activation current = currentActivation(c, model);
            if (current == null) {
                throw new StoreException(StoreException.NO_ACTIVE, model + " has no active version for " + tag + " to be compared with");
            }
            if (current.tag().equals(tag)) {
                throw new StoreException(StoreException.SHADOW_OF_ACTIVE, model + " " + tag + " is the active version; shadow another version"
                        + " to compare it with this one");
            }
            // a run is identified by its start; two starts within one millisecond still get distinct runs
            long previous = latestRunStart(c, model);
            Shadow replaced = endShadow(c, model, now, actor, "replaced by a shadow of " + tag);
            if (replaced != null) {
                previous = Math.max(previous, replaced.startedAt().toEpochMilli());
            }
            long started = Math.max(now, previous + 1);
            try (PreparedStatement insert = c.prepareStatement("INSERT INTO shadows (model, tag, fraction, started_at, actor) VALUES (?, ?, ?, ?, ?)")) {
                insert.setString(1, model);
                insert.setString(2, tag);
                insert.setDouble(3, fraction);
                insert.setLong(4, started);
                insert.setString(5, actor);
                insert.executeUpdate();
            }
            event(c, now, actor, StoreEvent.SHADOW_START, model, tag, "fraction " + fraction + " against the active " + current.tag());
            return new Shadow(model, tag, fraction, Instant.ofEpochMilli(started), actor);
        });
    }

    @Override
    public Optional<Shadow> stopShadow(String model, String actor, String reason) {
        Names.model(model);
        Names.actor(actor);
        long now = now();
        return write("stop the shadow of " + model, c -> {
            lockModel(c, model);
            return Optional.ofNullable(endShadow(c, model, now, actor, reason == null || reason.isBlank() ? "stopped" : reason));
        });
    }

    @Override
    public Optional<Shadow> shadow(String model) {
        Names.model(model);
        return read("read the shadow of " + model, c -> {
            List<Shadow> found = shadows(c, model);
            return found.isEmpty() ? Optional.empty() : Optional.of(found.get(0));
        });
    }

    @Override
    public List<Shadow> shadows() {
        return read("read the shadows", c -> shadows(c, null));
    }

    @Override
    public void saveShadowReport(ShadowReport report) {
        Objects.requireNonNull(report, "report");
        Names.model(report.model());
        Names.tag(report.tag());
        String json = report.summary().toJson().toString();
        write("save a shadow report of " + report.model(), c -> {
            try (PreparedStatement upsert = c.prepareStatement("INSERT INTO shadow_reports (model, tag, replica, run_started_at, updated_at, report_json)"
                    + " VALUES (?, ?, ?, ?, ?, ?) ON CONFLICT (model, tag, replica, run_started_at)"
                    + " DO UPDATE SET updated_at = excluded.updated_at, report_json = excluded.report_json")) {
                upsert.setString(1, report.model());
                upsert.setString(2, report.tag());
                upsert.setString(3, report.replica());
                upsert.setLong(4, report.runStartedAt().toEpochMilli());
                upsert.setLong(5, report.updatedAt().toEpochMilli());
                upsert.setString(6, json);
                upsert.executeUpdate();
            }
            return null;
        });
    }

    @Override
    public List<ShadowReport> shadowReports(String model, Optional<String> tag) {
        Names.model(model);
        tag.ifPresent(Names::tag);
        return read("read the shadow reports of " + model, c -> {
            String where = "model = ?" + (tag.isPresent() ? " AND tag = ?" : "");
            try (PreparedStatement select = c.prepareStatement("SELECT model, tag, replica, run_started_at, updated_at, report_json FROM shadow_reports"
                    + " WHERE " + where + " AND run_started_at = (SELECT MAX(run_started_at) FROM shadow_reports WHERE " + where + ")"
                    + " ORDER BY replica")) {
                int i = 1;
                for (int round = 0; round < 2; round++) {
                    select.setString(i++, model);
                    if (tag.isPresent()) {
                        select.setString(i++, tag.get());
                    }
                }
                List<ShadowReport> reports = new ArrayList<>();
                try (ResultSet rs = select.executeQuery()) {
                    while (rs.next()) {
                        reports.add(new ShadowReport(rs.getString(1), rs.getString(2), rs.getString(3), Instant.ofEpochMilli(rs.getLong(4)),
                                Instant.ofEpochMilli(rs.getLong(5)), ShadowSummary.fromJson(rs.getString(6))));
                    }
                }
                return reports;
            }
        });
    }

    private static List<Shadow> shadows(Connection c, String model) throws SQLException {
        try (PreparedStatement select = c.prepareStatement("SELECT model, tag, fraction, started_at, actor FROM shadows"
                + (model == null ? "" : " WHERE model = ?") + " ORDER BY model")) {
            if (model != null) {
                select.setString(1, model);
            }
            List<Shadow> found = new ArrayList<>();
            try (ResultSet rs = select.executeQuery()) {
                while (rs.next()) {
                    found.add(new Shadow(rs.getString(1), rs.getString(2), rs.getDouble(3), Instant.ofEpochMilli(rs.getLong(4)), rs.getString(5)));
                }
            }
            return found;
        }
    }

    private static long latestRunStart(Connection c, String model) throws SQLException {
        try (PreparedStatement select = c.prepareStatement("SELECT COALESCE(MAX(run_started_at), 0) FROM shadow_reports WHERE model = ?")) {
            select.setString(1, model);
            try (ResultSet rs = select.executeQuery()) {
                rs.next();
                return rs.getLong(1);
            }
        }
    }

    /** Deletes the model's shadow row inside the caller's transaction and records why; null when none ran. */
    private static Shadow endShadow(Connection c, String model, long now, String actor, String reason) throws SQLException {
        List<Shadow> running = shadows(c, model);
        if (running.isEmpty()) {
            return null;
        }
        try (PreparedStatement delete = c.prepareStatement("DELETE FROM shadows WHERE model = ?")) {
            delete.setString(1, model);
            delete.executeUpdate();
        }
        Shadow stopped = running.get(0);
        event(c, now, actor, StoreEvent.SHADOW_STOP, model, stopped.tag(), reason);
        return stopped;
    }

    /** How many notifications the PostgreSQL listener has received; -1 on SQLite. A test seam. */
    long notificationsReceived() {
        return listener == null ? -1 : listener.notifications();
    }

    /** A pooled connection, configured as the store's own are. A test seam. */
    Connection rawForTests() throws SQLException {
        return pool.getConnection();
    }

    @Override
    public String describe() {
        return url.describe();
    }

    @Override
    public void close() {
        if (listener != null) {
            listener.close();
        }
        pool.close();
    }

    // ---- rows ----

    private record VersionRow(long id, boolean retired) {
    }

    private static VersionRow versionRow(Connection c, String model, String tag) throws SQLException {
        try (PreparedStatement select = c.prepareStatement("SELECT id, retired_at FROM versions WHERE model = ? AND tag = ?")) {
            select.setString(1, model);
            select.setString(2, tag);
            try (ResultSet rs = select.executeQuery()) {
                if (!rs.next()) {
                    return null;
                }
                long id = rs.getLong(1);
                rs.getLong(2);
                return new VersionRow(id, !rs.wasNull());
            }
        }
    }

    private void lockModel(Connection c, String model) throws SQLException {
        if (!modelExists(c, model, url.dialect().lockClause)) {
            throw noSuchModel(model);
        }
    }

    private static void requireModel(Connection c, String model) throws SQLException {
        if (!modelExists(c, model, "")) {
            throw noSuchModel(model);
        }
    }

    private static boolean modelExists(Connection c, String model, String lockClause) throws SQLException {
        try (PreparedStatement select = c.prepareStatement("SELECT name FROM models WHERE name = ?" + lockClause)) {
            select.setString(1, model);
            try (ResultSet rs = select.executeQuery()) {
                return rs.next();
            }
        }
    }

    private static Activation currentActivation(Connection c, String model) throws SQLException {
        try (PreparedStatement select = c.prepareStatement("SELECT " + ACTIVATION_COLUMNS + " FROM activations WHERE model = ? ORDER BY seq DESC LIMIT 1")) {
            select.setString(1, model);
            List<Activation> rows = activationList(select);
            return rows.isEmpty() ? null : rows.get(0);
        }
    }

    private static Activation activation(Connection c, long seq) throws SQLException {
        try (PreparedStatement select = c.prepareStatement("SELECT " + ACTIVATION_COLUMNS + " FROM activations WHERE seq = ?")) {
            select.setLong(1, seq);
            return activationList(select).get(0);
        }
    }

    private static Long parentOf(Connection c, long seq) throws SQLException {
        try (PreparedStatement select = c.prepareStatement("SELECT parent_seq FROM activations WHERE seq = ?")) {
            select.setLong(1, seq);
            try (ResultSet rs = select.executeQuery()) {
                rs.next();
                long parent = rs.getLong(1);
                return rs.wasNull() ? null : parent;
            }
        }
    }

    private Activation appendActivation(Connection c, String model, String tag, long now, String actor, String reason, boolean rollback,
            Long parentSeq) throws SQLException {
        try (PreparedStatement insert = c.prepareStatement("INSERT INTO activations (model, tag, activated_at, actor, reason, is_rollback, parent_seq)"
                + " VALUES (?, ?, ?, ?, ?, ?, ?)")) {
            insert.setString(1, model);
            insert.setString(2, tag);
            insert.setLong(3, now);
            insert.setString(4, actor);
            insert.setString(5, reason);
            insert.setInt(6, rollback ? 1 : 0);
            if (parentSeq == null) {
                insert.setNull(7, java.sql.Types.BIGINT);
            } else {
                insert.setLong(7, parentSeq);
            }
            insert.executeUpdate();
        }
        if (url.dialect() == Dialect.POSTGRESQL) {
            // delivered when the transaction commits, and not at all if it rolls back
            try (PreparedStatement notify = c.prepareStatement("SELECT pg_notify(?, ?)")) {
                notify.setString(1, NOTIFY_CHANNEL);
                notify.setString(2, model);
                notify.execute();
            }
        }
        return currentActivation(c, model);
    }

    private static void event(Connection c, long now, String actor, String action, String model, String tag, String detail) throws SQLException {
        try (PreparedStatement insert = c.prepareStatement("INSERT INTO events (at, actor, action, model, tag, detail) VALUES (?, ?, ?, ?, ?, ?)")) {
            insert.setLong(1, now);
            insert.setString(2, actor);
            insert.setString(3, action);
            insert.setString(4, model);
            insert.setString(5, tag);
            insert.setString(6, detail);
            insert.executeUpdate();
        }
    }

    private static List<Activation> activationList(PreparedStatement select) throws SQLException {
        List<Activation> rows = new ArrayList<>();
        try (ResultSet rs = select.executeQuery()) {
            while (rs.next()) {
                rows.add(new Activation(rs.getLong(1), rs.getString(2), rs.getString(3), Instant.ofEpochMilli(rs.getLong(4)), rs.getString(5),
                        rs.getString(6), rs.getInt(7) != 0));
            }
        }
        return rows;
    }

    private static Version version(ResultSet rs) throws SQLException {
        return new Version(rs.getString(1), rs.getString(2), rs.getString(3), rs.getLong(4), Instant.ofEpochMilli(rs.getLong(5)),
                rs.getString(6), rs.getInt(7) != 0, rs.getInt(8) != 0, Optional.ofNullable(rs.getString(9)), Optional.ofNullable(rs.getString(10)));
    }

    private static StoreException noSuchModel(String model) {
        return new StoreException(StoreException.NO_SUCH_MODEL, "no model " + model + " in the store");
    }

    private static StoreException noSuchVersion(String model, String tag) {
        return new StoreException(StoreException.NO_SUCH_VERSION, "no version " + tag + " of model " + model + " in the store");
    }

    private long now() {
        return clock.millis();
    }

    // ---- transactions ----

    @FunctionalInterface
    private interface Work<T> {
        T run(Connection connection) throws SQLException;
    }

    private <T> T write(String operation, Work<T> work) {
        try (Connection c = pool.getConnection()) {
            c.setAutoCommit(false);
            T result;
            try {
                result = work.run(c);
                c.commit();
            } catch (SQLException | RuntimeException e) {
                // SQLite rolls a transaction back by itself on some errors (SQLITE_FULL among them); then both the rollback
                // and the commit that the driver's setAutoCommit(true) issues fail, and must not hide the error that matters
                try {
                    c.rollback();
                } catch (SQLException rollbackFailure) {
                    e.addSuppressed(rollbackFailure);
                }
                try {
                    c.setAutoCommit(true);
                } catch (SQLException resetFailure) {
                    e.addSuppressed(resetFailure);
                }
                throw e;
            }
            c.setAutoCommit(true);
            return result;
        } catch (SQLException e) {
            throw failure(operation, e);
        }
    }

    private <T> T read(String operation, Work<T> work) {
        try (Connection c = pool.getConnection()) {
            return work.run(c);
        } catch (SQLException e) {
            throw failure(operation, e);
        }
    }

    private StoreException failure(String operation, SQLException e) {
        return failure(url, operation, e);
    }

    /**
     * What a failed statement means to the caller. A connection that is gone or refused is
     * {@link StoreException#UNREACHABLE} on PostgreSQL, a state to wait out: SQLSTATE class 08
     * (connection exception), and 57P01 admin_shutdown, 57P02 crash_shutdown and 57P03
     * cannot_connect_now (PostgreSQL documentation, Appendix A, "PostgreSQL Error Codes"), which
     * a server that is stopping, crashing or starting sends on the connections it ends or refuses.
     */
    static StoreException failure(StoreUrl url, String operation, SQLException e) {
        String message = String.valueOf(e.getMessage());
        String lower = message.toLowerCase(Locale.ROOT);
        if (lower.contains("readonly") || lower.contains("read-only")) {
            return new StoreException(StoreException.READ_ONLY, url.describe() + ": cannot " + operation + ": the store is read-only", e);
        }
        // 08: connection exception (SQL standard); the pool's timeout waiting for a connection is transient too
        // SQLITE_FULL, or PostgreSQL's 53100 disk_full (PostgreSQL documentation, Appendix A, "Error Codes")
        if (lower.contains("sqlite_full") || lower.contains("disk is full") || "53100".equals(e.getSQLState())) {
            return new StoreException(StoreException.STORAGE_FULL, url.describe() + ": cannot " + operation
                    + ": the disk holding the store is full; nothing was written (" + StoreUrl.redact(firstLine(message)) + ")", e);
        }
        if (url.dialect() == Dialect.POSTGRESQL && (e instanceof java.sql.SQLTransientConnectionException || connectionLost(e.getSQLState()))) {
            return StoreDatabase.openFailure(url, e);
        }
        return new StoreException(StoreException.FAILURE, url.describe() + ": cannot " + operation + ": " + StoreUrl.redact(message), e);
    }

    private static boolean connectionLost(String sqlState) {
        return sqlState != null && (sqlState.startsWith("08") || SERVER_GOING_AWAY.contains(sqlState));
    }

    private static String firstLine(String message) {
        int newline = message.indexOf('\n');
        return newline < 0 ? message : message.substring(0, newline);
    }

    /** Counts the bytes read through it. */
    private static final class CountingInputStream extends FilterInputStream {
        private long count;

        CountingInputStream(InputStream in) {
            super(in);
        }

        @Override
        public int read() throws IOException {
            int b = super.read();
            count += b < 0 ? 0 : 1;
            return b;
        }

        @Override
        public int read(byte[] buffer, int offset, int length) throws IOException {
            int n = super.read(buffer, offset, length);
            count += Math.max(n, 0);
            return n;
        }

        @Override
        public long skip(long n) throws IOException {
            long skipped = super.skip(n);
            count += skipped;
            return skipped;
        }

        long count() {
            return count;
        }
    }
}
