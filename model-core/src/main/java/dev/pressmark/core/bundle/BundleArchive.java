package dev.pressmark.core.bundle;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.ByteArrayInputStream;
import java.io.ByteArrayOutputStream;
import java.io.EOFException;
import java.io.FilterOutputStream;
import java.io.IOException;
import java.io.InputStream;
import java.io.OutputStream;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.time.LocalDateTime;
import java.util.HashSet;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.zip.CRC32;
import java.util.zip.ZipEntry;
import java.util.zip.ZipOutputStream;

/**
 * The bundle container: a ZIP file whose entries come in a fixed order with a fixed timestamp,
 * stored uncompressed, so that the same content always gives the same bytes whatever the time
 * zone, the clock or the compressor library. The first entry, {@code manifest.json}, records the
 * format version and the SHA-256 and size of every other entry; the reader checks all of them.
 *
 * <p>Every entry of {@link #ENTRY_ORDER} is required: a bundle without its tokenizer, features,
 * weights or profile cannot be served or checked for drift, so a partial one is refused on both
 * sides rather than discovered at serving time. What goes inside the entries is the training
 * code's business; this class only moves bytes.
 *
 * <p>Entries are STORED, not deflated: the output of a deflater depends on its library and
 * version, which would break "same content, same bytes" between machines, and a stored entry's
 * size is known before its bytes, which makes the size limits exact.
 */
public final class BundleArchive {

    /**
     * The newest format version this program writes and reads. Format 2 adds tokenizers of several
     * views, character and token n-grams and the feature settings {@code min_df} and
     * {@code sublinear}; a model that uses none of them is written as format 1, byte for byte as
     * before, so that older readers still load it.
     */
    public static final int FORMAT_VERSION = 2;
    /** The first format; what a bundle that needs nothing newer is written as. */
    public static final int FORMAT_VERSION_1 = 1;
    public static final String FORMAT_VERSION_FIELD = "format_version";
    public static final String ENTRIES_FIELD = "entries";
    public static final String MANIFEST = "manifest.json";
    public static final String TOKENIZER = "tokenizer.json";
    public static final String FEATURES = "features.json";
    public static final String WEIGHTS = "weights.bin";
    public static final String PROFILE = "profile.json";
    /** Every entry in the order of the file. */
    public static final List<String> ENTRY_ORDER = List.of(MANIFEST, TOKENIZER, FEATURES, WEIGHTS, PROFILE);
    /** The largest bundle file the reader accepts: 512 MiB, far above a linear model over a few thousand tokens. */
    public static final long MAX_BUNDLE_BYTES = 512L << 20;
    /** The largest single entry the reader accepts: 256 MiB. */
    public static final long MAX_ENTRY_BYTES = 256L << 20;
    /** The largest manifest the reader accepts: 16 MiB. */
    public static final long MAX_MANIFEST_BYTES = 16L << 20;
    /** Every entry's modification time, as a local date-time so that no time zone enters the bytes. */
    static final LocalDateTime ENTRY_TIME = LocalDateTime.of(2000, 1, 1, 0, 0, 0);

    private BundleArchive() {
    }

    /**
     * Writes a bundle. {@code manifest} holds the training code's fields; this method adds
     * {@code format_version} and {@code entries} (which the caller must not set). {@code entries}
     * must hold exactly the entries of {@link #ENTRY_ORDER} after the manifest; the map's order
     * does not matter. The stream is not closed.
     */
    public static void write(ObjectNode manifest, Map<String, byte[]> entries, OutputStream out) throws IOException {
        write(manifest, entries, FORMAT_VERSION_1, out);
    }

    /** {@link #write(ObjectNode, Map, OutputStream)} under the given format version. */
    public static void write(ObjectNode manifest, Map<String, byte[]> entries, int formatVersion, OutputStream out)
            throws IOException {
        if (formatVersion != FORMAT_VERSION_1 && formatVersion != FORMAT_VERSION) {
            throw new IllegalArgumentException("formatVersion must be " + FORMAT_VERSION_1 + " or " + FORMAT_VERSION
                    + ", was " + formatVersion);
        }
        ObjectNode full = completeManifest(manifest, entries, formatVersion);
        try (ZipOutputStream zip = new ZipOutputStream(new KeepOpen(out))) {
            zip.setMethod(ZipOutputStream.STORED);
            put(zip, MANIFEST, CanonicalJson.bytes(full));
            for (String name : ENTRY_ORDER.subList(1, ENTRY_ORDER.size())) {
                put(zip, name, entries.get(name));
            }
        }
    }

    /** {@link #write} into a new array, as format 1. */
    public static byte[] toBytes(ObjectNode manifest, Map<String, byte[]> entries) {
        return toBytes(manifest, entries, FORMAT_VERSION_1);
    }

    /** {@link #write} into a new array, under the given format version. */
    public static byte[] toBytes(ObjectNode manifest, Map<String, byte[]> entries, int formatVersion) {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        try {
            write(manifest, entries, formatVersion, out);
        } catch (IOException e) {
            throw new UncheckedIOException("a byte array stream failed", e);
        }
        return out.toByteArray();
    }

    /** Reads and verifies a bundle file; messages start with the file's path. */
    public static BundleContents read(Path file) {
        try (InputStream in = Files.newInputStream(file)) {
            return read(in);
        } catch (NoSuchFileException e) {
            throw new BundleException(BundleException.UNREADABLE, file + ": no such file", e);
        } catch (BundleException e) {
            throw new BundleException(e.code(), file + ": " + e.getMessage(), e);
        } catch (IOException e) {
            throw new BundleException(BundleException.UNREADABLE, file + ": cannot read: " + e.getMessage(), e);
        }
    }

    /** Reads and verifies a bundle held in memory. */
    public static BundleContents read(byte[] bundle) {
        return read(new ByteArrayInputStream(bundle));
    }

    /**
     * Reads and verifies a bundle to the end of {@code in} (which is not closed): manifest first,
     * a known format version, each entry's SHA-256, size and CRC-32, no duplicate, unknown,
     * unlisted or missing entry, no entry name that could escape a directory, the central directory
     * consistent with the entries, and the size limits. Any failure is a {@link BundleException}.
     */
    public static BundleContents read(InputStream in) {
        return read(in, MAX_BUNDLE_BYTES, MAX_ENTRY_BYTES);
    }

    static BundleContents read(InputStream in, long maxBundleBytes, long maxEntryBytes) {
        StoredZipReader zip = new StoredZipReader(in, maxBundleBytes, maxEntryBytes);
        try {
            return read(zip);
        } catch (EOFException e) {
            throw new BundleException(BundleException.CORRUPT, "truncated: the file ends after " + zip.position() + " bytes", e);
        } catch (IOException e) {
            throw new BundleException(BundleException.UNREADABLE, "cannot read the bundle: " + e.getMessage(), e);
        }
    }

    private static BundleContents read(StoredZipReader zip) throws IOException {
        StoredZipReader.Entry first = zip.next(BundleArchive::checkName);
        if (first == null) {
            throw StoredZipReader.corrupt("the ZIP file has no entries");
        }
        if (!first.name().equals(MANIFEST)) {
            throw StoredZipReader.corrupt("the first entry must be " + MANIFEST + ", found " + first.name());
        }
        if (first.data().length > MAX_MANIFEST_BYTES) {
            throw new BundleException(BundleException.TOO_LARGE, MANIFEST + " has " + first.data().length
                    + " bytes; the limit is " + MAX_MANIFEST_BYTES);
        }
        JsonNode manifest = parseManifest(first.data());
        Map<String, Listed> listed = listedEntries(manifest);
        Map<String, byte[]> entries = new LinkedHashMap<>();
        Set<String> seen = new HashSet<>();
        seen.add(MANIFEST);
        int previous = 0;
        for (StoredZipReader.Entry entry = zip.next(name -> checkEntry(name, seen)); entry != null;
                entry = zip.next(name -> checkEntry(name, seen))) {
            String name = entry.name();
            int index = ENTRY_ORDER.indexOf(name);
            if (index < previous) {
                throw StoredZipReader.corrupt("entry " + name + " comes after " + ENTRY_ORDER.get(previous)
                        + "; the order is " + ENTRY_ORDER);
            }
            previous = index;
            Listed expected = listed.get(name);
            if (expected == null) {
                throw new BundleException(BundleException.ENTRY_MISMATCH, "entry " + name + " is not listed in the manifest");
            }
            byte[] data = entry.data();
            if (data.length != expected.size()) {
                throw new BundleException(BundleException.CHECKSUM, "entry " + name + ": size " + data.length
                        + " does not match the manifest's " + expected.size() + " (checksum failed)");
            }
            String actual = Sha256.hex(data);
            if (!actual.equals(expected.sha256())) {
                throw new BundleException(BundleException.CHECKSUM, "entry " + name + ": SHA-256 checksum mismatch: manifest "
                        + expected.sha256() + ", content " + actual);
            }
            entries.put(name, data);
        }
        zip.finish();
        for (String name : ENTRY_ORDER.subList(1, ENTRY_ORDER.size())) {
            if (!entries.containsKey(name)) {
                throw new BundleException(BundleException.ENTRY_MISMATCH, "entry " + name + " is missing"
                        + (listed.containsKey(name) ? " though the manifest lists it" : ""));
            }
        }
        return new BundleContents(manifest, entries);
    }

    private static void checkEntry(String name, Set<String> seen) {
        checkName(name);
        if (!seen.add(name)) {
            throw new BundleException(BundleException.DUPLICATE_ENTRY, "entry " + name + " appears twice");
        }
    }

    private static void checkName(String name) {
        if (name.isEmpty() || name.indexOf('/') >= 0 || name.indexOf('\\') >= 0 || name.indexOf('\0') >= 0
                || name.contains("..") || name.indexOf(':') >= 0) {
            throw new BundleException(BundleException.ENTRY_NAME, "unsafe entry name \"" + printable(name)
                    + "\": names may not be empty or contain '/', '\\', ':', '..' or NUL");
        }
        if (!ENTRY_ORDER.contains(name)) {
            throw new BundleException(BundleException.ENTRY_NAME, "unknown entry " + name + "; format version "
                    + FORMAT_VERSION + " has " + ENTRY_ORDER);
        }
    }

    private static String printable(String name) {
        StringBuilder out = new StringBuilder();
        for (int i = 0; i < name.length() && i < 100; i++) {
            char c = name.charAt(i);
            out.append(c < 0x20 || c == 0x7f ? String.format("\\u%04x", (int) c) : String.valueOf(c));
        }
        return out.toString();
    }

    private static JsonNode parseManifest(byte[] bytes) {
        JsonNode manifest;
        try {
            manifest = CanonicalJson.parse(bytes);
        } catch (JsonProcessingException e) {
            throw new BundleException(BundleException.MANIFEST, MANIFEST + " is not valid JSON: " + e.getOriginalMessage(), e);
        } catch (IOException e) {
            throw new BundleException(BundleException.MANIFEST, MANIFEST + " cannot be parsed: " + e.getMessage(), e);
        }
        if (manifest == null || !manifest.isObject()) {
            throw new BundleException(BundleException.MANIFEST, MANIFEST + " must be a JSON object");
        }
        JsonNode version = manifest.get(FORMAT_VERSION_FIELD);
        if (version == null || !version.isIntegralNumber()) {
            throw new BundleException(BundleException.MANIFEST, MANIFEST + " has no integer " + FORMAT_VERSION_FIELD);
        }
        if (!version.canConvertToInt() || version.intValue() != FORMAT_VERSION && version.intValue() != FORMAT_VERSION_1) {
            throw new BundleException(BundleException.FORMAT_VERSION, "unsupported bundle format version " + version.asText()
                    + "; this program reads " + FORMAT_VERSION_1 + " and " + FORMAT_VERSION);
        }
        return manifest;
    }

    private record Listed(String sha256, long size) {
    }

    private static Map<String, Listed> listedEntries(JsonNode manifest) {
        JsonNode entries = manifest.get(ENTRIES_FIELD);
        if (entries == null || !entries.isObject()) {
            throw new BundleException(BundleException.MANIFEST, MANIFEST + " has no " + ENTRIES_FIELD + " object");
        }
        Map<String, Listed> listed = new LinkedHashMap<>();
        for (Map.Entry<String, JsonNode> field : entries.properties()) {
            JsonNode sha = field.getValue().get("sha256");
            JsonNode size = field.getValue().get("size");
            if (sha == null || !Sha256.isHex(sha.asText(null)) || size == null || !size.canConvertToLong() || !size.isIntegralNumber()
                    || size.longValue() < 0) {
                throw new BundleException(BundleException.MANIFEST, MANIFEST + ": entries." + field.getKey()
                        + " needs a 64-digit lower-case hex sha256 and a non-negative integer size");
            }
            listed.put(field.getKey(), new Listed(sha.asText(), size.longValue()));
        }
        return listed;
    }

    /** {@code manifest} with the format version and the listing of {@code entries} that the archive writes. */
    static ObjectNode completeManifest(ObjectNode manifest, Map<String, byte[]> entries, int formatVersion) {
        if (manifest.has(FORMAT_VERSION_FIELD) || manifest.has(ENTRIES_FIELD)) {
            throw new IllegalArgumentException("the manifest must not set " + FORMAT_VERSION_FIELD + " or " + ENTRIES_FIELD
                    + "; the archive writes them");
        }
        List<String> required = ENTRY_ORDER.subList(1, ENTRY_ORDER.size());
        for (String name : entries.keySet()) {
            if (!required.contains(name)) {
                throw new IllegalArgumentException("unknown bundle entry " + name + "; the entries are " + required);
            }
        }
        ObjectNode full = manifest.deepCopy();
        full.put(FORMAT_VERSION_FIELD, formatVersion);
        ObjectNode listed = full.putObject(ENTRIES_FIELD);
        for (String name : required) {
            byte[] data = entries.get(name);
            if (data == null) {
                throw new IllegalArgumentException("bundle entry " + name + " is missing; every bundle has " + required);
            }
            listed.putObject(name).put("sha256", Sha256.hex(data)).put("size", data.length);
        }
        return full;
    }

    private static void put(ZipOutputStream zip, String name, byte[] data) throws IOException {
        ZipEntry entry = new ZipEntry(name);
        entry.setMethod(ZipEntry.STORED);
        entry.setSize(data.length);
        entry.setCompressedSize(data.length);
        CRC32 crc = new CRC32();
        crc.update(data);
        entry.setCrc(crc.getValue());
        // setTimeLocal writes the DOS date-time fields as given, with no zone conversion and no extra field
        entry.setTimeLocal(ENTRY_TIME);
        zip.putNextEntry(entry);
        zip.write(data);
        zip.closeEntry();
    }

    /** Lets the ZIP stream be closed, freeing its deflater, without closing the caller's stream. */
    private static final class KeepOpen extends FilterOutputStream {
        KeepOpen(OutputStream out) {
            super(out);
        }

        @Override
        public void write(byte[] b, int off, int len) throws IOException {
            out.write(b, off, len);
        }

        @Override
        public void close() throws IOException {
            flush();
        }
    }
}
