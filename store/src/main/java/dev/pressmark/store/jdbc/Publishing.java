package dev.pressmark.store.jdbc;

import dev.pressmark.core.bundle.BundleArchive;
import dev.pressmark.core.bundle.BundleContents;
import dev.pressmark.core.bundle.BundleException;
import dev.pressmark.core.bundle.Sha256;
import dev.pressmark.core.contract.ContractRecord;
import dev.pressmark.core.sign.BundleSignature;
import dev.pressmark.store.Activation;
import dev.pressmark.store.Names;
import dev.pressmark.store.PublishOptions;
import dev.pressmark.store.StoreEvent;
import dev.pressmark.store.StoreException;
import dev.pressmark.store.Version;
import dev.pressmark.store.lifecycle.PublishCheck;
import dev.pressmark.store.lifecycle.SignatureCheck;
import java.nio.file.Path;
import java.security.MessageDigest;
import java.sql.Connection;
import java.sql.PreparedStatement;
import java.sql.ResultSet;
import java.sql.SQLException;
import java.time.Clock;
import java.time.Instant;
import java.util.Objects;
import java.util.Optional;

/**
 * Publishing a version: the bundle is checked and loaded as a model before the transaction, then
 * stored in one transaction with its signature and contract checks and its audit event. A tag
 * that exists is refused.
 */
final class Publishing {

    private final Transactions tx;
    private final Clock clock;

    Publishing(Transactions tx, Clock clock) {
        this.tx = tx;
        this.clock = clock;
    }

    /** The bundle's bytes as the publishing transaction stores them. */
    interface BundleBytes {
        /** Sets the statement parameter that holds the bytes. */
        void bind(PreparedStatement statement, int index) throws SQLException;

        /** After the statement ran: fails the transaction if what it stored is not what was checked. */
        default void verify() {
        }
    }

    Version publish(String model, String tag, byte[] bundle, PublishOptions options, String actor) {
        Objects.requireNonNull(bundle, "bundle");
        checkNames(model, tag, options, actor);
        BundleContents contents;
        try {
            contents = BundleArchive.read(bundle);
        } catch (BundleException e) {
            throw PublishCheck.notABundle(e, "");
        }
        PublishCheck.load(contents, model, tag, "cannot publish ");
        return insert(model, tag, contents, Sha256.hex(bundle), bundle.length, (statement, index) -> statement.setBytes(index, bundle), options,
                actor);
    }

    Version publish(String model, String tag, Path bundle, PublishOptions options, String actor) {
        Objects.requireNonNull(bundle, "bundle");
        checkNames(model, tag, options, actor);
        long size = BundleFile.size(bundle);
        MessageDigest digest = Sha256.newDigest();
        BundleContents contents = BundleFile.read(bundle, digest);
        PublishCheck.load(contents, model, tag, "cannot publish ");
        String sha256 = Sha256.toHex(digest.digest());
        try (BundleFile.Stored stored = new BundleFile.Stored(bundle, size, sha256)) {
            return insert(model, tag, contents, sha256, size, stored, options, actor);
        }
    }

    private static void checkNames(String model, String tag, PublishOptions options, String actor) {
        Objects.requireNonNull(options, "options");
        Names.model(model);
        Names.tag(tag);
        Names.actor(actor);
    }

    /** Stores a checked bundle in one transaction. */
    private Version insert(String model, String tag, BundleContents contents, String sha256, long size, BundleBytes bytes, PublishOptions options,
            String actor) {
        String manifest = contents.manifestJson();
        long now = clock.millis();
        return tx.write("publish " + model + " " + tag, c -> {
            ModelRows.ensure(c, model, now);
            ModelRows.lock(c, tx.dialect(), model);
            if (VersionRows.row(c, model, tag) != null) {
                throw new StoreException(StoreException.TAG_EXISTS, model + " " + tag + " is already published; a published tag is immutable,"
                        + " so publish under a new tag");
            }
            SignatureCheck.check(options.signatureJson(), sha256, KeyRows.list(c), "cannot publish " + model + " " + tag);
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
            EventRows.append(c, now, actor, StoreEvent.PUBLISH, model, tag, "sha256 " + sha256 + ", " + size + " bytes" + signedBy
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
        Activation current = ActivationRows.current(c, model);
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
        return PublishCheck.contract(model, tag, contents, current.tag(), activeManifest, Optional.ofNullable(activeContract), allowBreaking);
    }
}
