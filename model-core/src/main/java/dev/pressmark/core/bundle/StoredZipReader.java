package dev.pressmark.core.bundle;

import java.io.EOFException;
import java.io.IOException;
import java.io.InputStream;
import java.nio.ByteBuffer;
import java.nio.charset.CharacterCodingException;
import java.nio.charset.CodingErrorAction;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;
import java.util.zip.CRC32;

/**
 * A strict, streaming reader of the one ZIP layout bundles use (APPNOTE 6.3.x, the PKWARE ZIP
 * file format specification): entries STORED, sizes and CRC-32 in every local header, no data
 * descriptors, no encryption, no ZIP64, then a central directory that must repeat the local
 * headers exactly, then the end record and nothing after it.
 *
 * <p>Being this strict is what makes the limits hold: every entry's size is declared before its
 * bytes and checked against the caps before anything is read, the bytes are read in small steps
 * so that a lying header costs no large allocation, and no decompressor can expand a few bytes
 * into gigabytes.
 */
final class StoredZipReader {

    static final int LOCAL_SIGNATURE = 0x04034b50;
    static final int CENTRAL_SIGNATURE = 0x02014b50;
    static final int END_SIGNATURE = 0x06054b50;
    /** General-purpose flag bit 11: the name is UTF-8. The only flag a bundle may carry. */
    static final int FLAG_UTF8 = 0x800;
    static final int METHOD_STORED = 0;

    /** One local entry as read: its header fields and its bytes (CRC-32 already checked). */
    record Entry(String name, long offset, int flags, long crc, byte[] data) {
    }

    private final InputStream in;
    private final long maxTotalBytes;
    private final long maxEntryBytes;
    private final List<Entry> entries = new ArrayList<>();
    private long position;
    private int pendingSignature;
    private boolean pendingRead;

    StoredZipReader(InputStream in, long maxTotalBytes, long maxEntryBytes) {
        this.in = in;
        this.maxTotalBytes = maxTotalBytes;
        this.maxEntryBytes = maxEntryBytes;
    }

    /**
     * The next local entry, or {@code null} when the central directory starts. The name is
     * checked by {@code nameCheck} before any of the entry's bytes are read.
     */
    Entry next(NameCheck nameCheck) throws IOException {
        long offset = position;
        int signature = signature();
        if (signature == CENTRAL_SIGNATURE) {
            pendingRead = true;
            pendingSignature = signature;
            return null;
        }
        if (signature != LOCAL_SIGNATURE) {
            throw corrupt(entries.isEmpty()
                    ? "not a bundle: it does not start as a ZIP file"
                    : String.format("expected an entry or the central directory at byte %d, found 0x%08x", offset, signature));
        }
        u16(); // version needed to extract: informational
        int flags = u16();
        int method = u16();
        u32(); // DOS time and date: fixed by the writer, not checked
        long crc = u32();
        long compressedSize = u32();
        long size = u32();
        int nameLength = u16();
        int extraLength = u16();
        String name = name(bytes(nameLength));
        nameCheck.check(name);
        skip(extraLength);
        if ((flags & ~FLAG_UTF8) != 0) {
            throw corrupt(String.format("entry %s: unsupported ZIP flags 0x%04x (encryption or data descriptor)", name, flags));
        }
        if (method != METHOD_STORED) {
            throw corrupt("entry " + name + ": compression method " + method + "; bundle entries are stored uncompressed");
        }
        if (compressedSize != size) {
            throw corrupt("entry " + name + ": stored size " + compressedSize + " differs from size " + size);
        }
        if (size > maxEntryBytes) {
            throw new BundleException(BundleException.TOO_LARGE,
                    "entry " + name + " declares " + size + " bytes; the limit is " + maxEntryBytes);
        }
        if (position + size > maxTotalBytes) {
            throw tooLarge();
        }
        byte[] data = bytes((int) size);
        CRC32 actual = new CRC32();
        actual.update(data);
        if (actual.getValue() != crc) {
            throw new BundleException(BundleException.CHECKSUM, "entry " + name + ": CRC-32 checksum mismatch");
        }
        Entry entry = new Entry(name, offset, flags, crc, data);
        entries.add(entry);
        return entry;
    }

    /** Reads the central directory and the end record, checks them against the entries, and requires the end of input. */
    void finish() throws IOException {
        // next() has already consumed the first record's signature
        long directoryOffset = pendingRead ? position - 4 : position;
        for (int i = 0; ; i++) {
            int signature = signature();
            if (signature == END_SIGNATURE) {
                if (i != entries.size()) {
                    throw corrupt("the central directory lists " + i + " entries; the file has " + entries.size());
                }
                break;
            }
            if (signature != CENTRAL_SIGNATURE) {
                throw corrupt(String.format("expected a central directory record at byte %d, found 0x%08x", position - 4, signature));
            }
            if (i >= entries.size()) {
                throw corrupt("the central directory lists more entries than the file has");
            }
            centralRecord(entries.get(i));
        }
        long directorySize = position - 4 - directoryOffset;
        int disk = u16();
        int directoryDisk = u16();
        int entriesOnDisk = u16();
        int totalEntries = u16();
        long recordedSize = u32();
        long recordedOffset = u32();
        int commentLength = u16();
        skip(commentLength);
        if (disk != 0 || directoryDisk != 0 || entriesOnDisk != entries.size() || totalEntries != entries.size()
                || recordedSize != directorySize || recordedOffset != directoryOffset) {
            throw corrupt("the end of central directory record does not match the entries");
        }
        if (in.read() != -1) {
            throw corrupt("unexpected bytes after the end of the ZIP file");
        }
    }

    private void centralRecord(Entry local) throws IOException {
        u16(); // version made by
        u16(); // version needed
        int flags = u16();
        int method = u16();
        u32(); // time and date
        long crc = u32();
        long compressedSize = u32();
        long size = u32();
        int nameLength = u16();
        int extraLength = u16();
        int commentLength = u16();
        u16(); // disk number start
        u16(); // internal attributes
        u32(); // external attributes
        long offset = u32();
        String name = name(bytes(nameLength));
        skip(extraLength);
        skip(commentLength);
        if (!name.equals(local.name()) || flags != local.flags() || method != METHOD_STORED || crc != local.crc()
                || compressedSize != local.data().length || size != local.data().length || offset != local.offset()) {
            throw corrupt("the central directory record of " + name + " does not match its local header");
        }
    }

    private int signature() throws IOException {
        if (pendingRead) {
            pendingRead = false;
            return pendingSignature;
        }
        return (int) u32();
    }

    private int u16() throws IOException {
        byte[] b = bytes(2);
        return (b[0] & 0xff) | (b[1] & 0xff) << 8;
    }

    private long u32() throws IOException {
        byte[] b = bytes(4);
        return ((b[0] & 0xffL) | (b[1] & 0xffL) << 8 | (b[2] & 0xffL) << 16 | (b[3] & 0xffL) << 24);
    }

    private void skip(int n) throws IOException {
        bytes(n);
    }

    private byte[] bytes(int n) throws IOException {
        if (position + n > maxTotalBytes) {
            throw tooLarge();
        }
        // readNBytes grows its buffer as bytes arrive, so a header that lies about a size costs no allocation
        byte[] b = in.readNBytes(n);
        if (b.length != n) {
            throw new EOFException();
        }
        position += n;
        return b;
    }

    private BundleException tooLarge() {
        return new BundleException(BundleException.TOO_LARGE, "the bundle is larger than the limit of " + maxTotalBytes + " bytes");
    }

    private static String name(byte[] bytes) {
        try {
            return StandardCharsets.UTF_8.newDecoder()
                    .onMalformedInput(CodingErrorAction.REPORT)
                    .onUnmappableCharacter(CodingErrorAction.REPORT)
                    .decode(ByteBuffer.wrap(bytes))
                    .toString();
        } catch (CharacterCodingException e) {
            throw new BundleException(BundleException.ENTRY_NAME, "an entry name is not valid UTF-8", e);
        }
    }

    long position() {
        return position;
    }

    static BundleException corrupt(String message) {
        return new BundleException(BundleException.CORRUPT, message);
    }

    /** Checks an entry name before its bytes are read. */
    @FunctionalInterface
    interface NameCheck {
        void check(String name);
    }
}
