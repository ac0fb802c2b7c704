package dev.pressmark.store.jdbc;

import dev.pressmark.core.bundle.BundleArchive;
import dev.pressmark.core.bundle.BundleContents;
import dev.pressmark.core.bundle.BundleException;
import dev.pressmark.core.bundle.Sha256;
import dev.pressmark.store.LoadedBundle;
import dev.pressmark.store.Names;
import dev.pressmark.store.StoreException;
import dev.pressmark.store.VerifyReport;
import dev.pressmark.store.Version;
import dev.pressmark.store.lifecycle.PublishCheck;
import dev.pressmark.store.lifecycle.SignatureCheck;
import java.io.FilterInputStream;
import java.io.IOException;
import java.io.InputStream;
import java.io.OutputStream;
import java.security.DigestInputStream;
import java.security.MessageDigest;
import java.sql.PreparedStatement;
import java.sql.ResultSet;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;

/**
 * The stored bundles read back: for serving, streamed through the bundle reader and the SHA-256
 * at once and refused when they no longer match; and all of them verified, one at a time.
 */
final class StoredBundles {

    private final Transactions tx;
    private final VersionRows versions;

    StoredBundles(Transactions tx, VersionRows versions) {
        this.tx = tx;
        this.versions = versions;
    }

    LoadedBundle load(String model, String tag) {
        Version version = versions.version(model, tag).orElseThrow(() -> VersionRows.noSuchVersion(model, tag));
        return tx.read("load " + model + " " + tag, c -> {
            SignatureCheck.check(version.signatureJson(), version.sha256(), KeyRows.list(c), model + " " + tag + " will not be served");
            try (PreparedStatement select = c.prepareStatement("SELECT bundle FROM versions WHERE model = ? AND tag = ?")) {
                select.setString(1, model);
                select.setString(2, tag);
                try (ResultSet rs = select.executeQuery()) {
                    if (!rs.next()) {
                        throw VersionRows.noSuchVersion(model, tag);
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

    VerifyReport verify(Optional<String> model) {
        model.ifPresent(Names::model);
        return tx.read("verify", c -> {
            if (model.isPresent()) {
                ModelRows.require(c, model.get());
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
            PublishCheck.load(contents, version.model(), version.tag(), "");
        } catch (StoreException e) {
            String prefix = version.model() + " " + version.tag() + ": ";
            unusable.add(new VerifyReport.Unusable(version.model(), version.tag(),
                    e.getMessage().startsWith(prefix) ? e.getMessage().substring(prefix.length()) : e.getMessage()));
        }
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
