package dev.pressmark.store;

import dev.pressmark.core.bundle.BundleArchive;
import dev.pressmark.core.bundle.BundleContents;
import dev.pressmark.core.bundle.BundleException;
import dev.pressmark.core.bundle.Sha256;
import java.io.IOException;
import java.io.InputStream;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.security.DigestInputStream;
import java.security.MessageDigest;
import java.sql.PreparedStatement;
import java.sql.SQLException;

/**
 * A bundle published from a file, streamed rather than read into memory first: its size and kind
 * are checked before a byte is read (a device such as {@code /dev/zero} never ends; a file past
 * the bundle limit is refused by its size alone), the checksum is computed as the reader goes,
 * and the database reads the file again as it stores it, checked against the same SHA-256.
 */
final class BundleFile {

    private BundleFile() {
    }

    /** The size of {@code file}, which must be a regular file within {@link BundleArchive#MAX_BUNDLE_BYTES}. */
    static long size(Path file) {
        if (!Files.exists(file)) {
            throw new StoreException(StoreException.NOT_A_BUNDLE, file + ": no such file");
        }
        if (!Files.isRegularFile(file)) {
            throw new StoreException(StoreException.NOT_A_BUNDLE, file + ": not a regular file (a directory, device or pipe); a bundle is a file");
        }
        try {
            long size = Files.size(file);
            if (size > BundleArchive.MAX_BUNDLE_BYTES) {
                throw new StoreException(StoreException.LIMIT, String.format("%s: %,d bytes, more than %,d, the limit on a bundle's size", file, size,
                        BundleArchive.MAX_BUNDLE_BYTES));
            }
            return size;
        } catch (IOException e) {
            throw new StoreException(StoreException.FAILURE, file + ": cannot read: " + e.getMessage(), e);
        }
    }

    /** Reads and verifies the bundle in {@code file}, feeding every byte to {@code digest}. */
    static BundleContents read(Path file, MessageDigest digest) {
        try (InputStream in = new DigestInputStream(Files.newInputStream(file), digest)) {
            return BundleArchive.read(in);
        } catch (BundleException e) {
            throw BundleCheck.notABundle(e, file + ": ");
        } catch (NoSuchFileException e) {
            throw new StoreException(StoreException.NOT_A_BUNDLE, file + ": no such file", e);
        } catch (IOException e) {
            throw new StoreException(StoreException.FAILURE, file + ": cannot read: " + e.getMessage(), e);
        }
    }

    /**
     * The file's {@code size} bytes as a stream for the database to store, checked after the insert
     * against {@code sha256}: a file that changed after it was checked fails the transaction.
     */
    static final class Stored implements JdbcBundleStore.BundleBytes, AutoCloseable {

        private final Path file;
        private final long size;
        private final String sha256;
        private final MessageDigest digest = Sha256.newDigest();
        private InputStream in;

        Stored(Path file, long size, String sha256) {
            this.file = file;
            this.size = size;
            this.sha256 = sha256;
        }

        @Override
        public void bind(PreparedStatement statement, int index) throws SQLException {
            close();
            digest.reset();
            try {
                in = new DigestInputStream(Files.newInputStream(file), digest);
            } catch (IOException e) {
                throw new StoreException(StoreException.FAILURE, file + ": cannot read: " + e.getMessage(), e);
            }
            // size is at most MAX_BUNDLE_BYTES, below 2^31; both drivers read exactly this many bytes
            statement.setBinaryStream(index, in, (int) size);
        }

        @Override
        public void verify() {
            String stored = Sha256.toHex(digest.digest());
            if (!stored.equals(sha256)) {
                throw new StoreException(StoreException.NOT_A_BUNDLE, file + ": changed while it was being published (SHA-256 " + stored
                        + ", checked " + sha256 + "); nothing was stored");
            }
        }

        @Override
        public void close() {
            if (in != null) {
                try {
                    in.close();
                } catch (IOException e) {
                    throw new UncheckedIOException(file + ": cannot close: " + e.getMessage(), e);
                }
                in = null;
            }
        }
    }
}
