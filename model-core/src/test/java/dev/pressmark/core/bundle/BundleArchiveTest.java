package dev.pressmark.core.bundle;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.catchThrowableOfType;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.ByteArrayInputStream;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.LocalDateTime;
import java.util.ArrayList;
import java.util.Collections;
import java.util.Enumeration;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.TimeZone;
import java.util.zip.ZipEntry;
import java.util.zip.ZipFile;
import java.util.zip.ZipOutputStream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class BundleArchiveTest {

    @TempDir
    Path dir;

    @Test
    void a_written_bundle_reads_back_with_its_manifest_fields_and_entries() {
        Map<String, byte[]> entries = TestBundles.entries(1);
        BundleContents contents = BundleArchive.read(BundleArchive.toBytes(TestBundles.manifest(), entries));

        assertThat(contents.formatVersion()).isEqualTo(1);
        assertThat(contents.manifest().get("name").asText()).isEqualTo("routing");
        assertThat(contents.manifest().get("metrics").get("accuracy").asDouble()).isEqualTo(0.875);
        assertThat(contents.entries().keySet()).containsExactlyElementsOf(BundleArchive.ENTRY_ORDER.subList(1, 5));
        for (Map.Entry<String, byte[]> entry : entries.entrySet()) {
            assertThat(contents.entry(entry.getKey())).as(entry.getKey()).isEqualTo(entry.getValue());
            JsonNode listed = contents.manifest().get("entries").get(entry.getKey());
            assertThat(listed.get("size").asLong()).isEqualTo(entry.getValue().length);
            assertThat(listed.get("sha256").asText()).isEqualTo(Sha256.hex(entry.getValue()));
        }
    }

    @Test
    void the_order_of_the_callers_map_does_not_change_the_bytes() {
        Map<String, byte[]> entries = TestBundles.entries(2);
        List<String> names = new ArrayList<>(entries.keySet());
        Collections.reverse(names);
        Map<String, byte[]> reversed = new LinkedHashMap<>();
        for (String name : names) {
            reversed.put(name, entries.get(name));
        }
        assertThat(BundleArchive.toBytes(TestBundles.manifest(), reversed))
                .isEqualTo(BundleArchive.toBytes(TestBundles.manifest(), entries));
    }

    @Test
    void identical_content_gives_identical_bytes_in_any_time_zone_and_at_any_time() throws InterruptedException {
        TimeZone original = TimeZone.getDefault();
        try {
            TimeZone.setDefault(TimeZone.getTimeZone("UTC"));
            byte[] utc = TestBundles.bundle(3);
            Thread.sleep(1100); // a DOS timestamp has two-second resolution: cross a boundary
            TimeZone.setDefault(TimeZone.getTimeZone("Pacific/Kiritimati"));
            byte[] plus14 = TestBundles.bundle(3);
            TimeZone.setDefault(TimeZone.getTimeZone("America/St_Johns"));
            byte[] minus330 = TestBundles.bundle(3);
            assertThat(plus14).isEqualTo(utc);
            assertThat(minus330).isEqualTo(utc);
        } finally {
            TimeZone.setDefault(original);
        }
    }

    @Test
    void the_jdks_zip_reader_sees_stored_entries_in_the_fixed_order_with_the_fixed_time_and_no_extra_fields() throws IOException {
        // java.util.zip.ZipFile reads the central directory, an implementation independent of ours.
        Path file = dir.resolve("model.pmb");
        Files.write(file, TestBundles.bundle(4));
        List<String> names = new ArrayList<>();
        try (ZipFile zip = new ZipFile(file.toFile())) {
            for (Enumeration<? extends ZipEntry> e = zip.entries(); e.hasMoreElements(); ) {
                ZipEntry entry = e.nextElement();
                names.add(entry.getName());
                assertThat(entry.getMethod()).isEqualTo(ZipEntry.STORED);
                assertThat(entry.getTimeLocal()).isEqualTo(LocalDateTime.of(2000, 1, 1, 0, 0));
                assertThat(entry.getExtra()).isNull();
                if (!entry.getName().equals(BundleArchive.MANIFEST)) {
                    assertThat(zip.getInputStream(entry).readAllBytes()).isEqualTo(TestBundles.entries(4).get(entry.getName()));
                }
            }
        }
        assertThat(names).containsExactlyElementsOf(BundleArchive.ENTRY_ORDER);
    }

    @Test
    void the_manifest_is_compact_json_with_sorted_keys_and_a_final_newline() throws IOException {
        ObjectNode manifest = TestBundles.manifest();
        manifest.putObject("zeta").put("b", 1).put("a", 2);
        String text = manifestText(BundleArchive.toBytes(manifest, TestBundles.entries(5)));
        assertThat(text).endsWith("}\n").doesNotContain("\n ").doesNotContain(": ");
        assertThat(text).startsWith("{\"created\":\"2026-03-01T10:00:00Z\",\"entries\":{\"features.json\":{\"sha256\":");
        assertThat(text).contains("\"format_version\":1,\"labels\":[\"plumbing\",\"lighting\"],"
                + "\"metrics\":{\"accuracy\":0.875,\"macro_f1\":0.8125},\"name\":\"routing\",\"zeta\":{\"a\":2,\"b\":1}}");
    }

    @Test
    void the_writer_refuses_unknown_and_missing_entries_and_a_manifest_that_sets_the_version() {
        Map<String, byte[]> unknown = TestBundles.entries(6);
        unknown.put("notes.txt", new byte[1]);
        assertThatThrownBy(() -> BundleArchive.toBytes(TestBundles.manifest(), unknown))
                .isInstanceOf(IllegalArgumentException.class).hasMessageContaining("unknown bundle entry notes.txt");
        Map<String, byte[]> missing = TestBundles.entries(6);
        missing.remove(BundleArchive.PROFILE);
        assertThatThrownBy(() -> BundleArchive.toBytes(TestBundles.manifest(), missing))
                .isInstanceOf(IllegalArgumentException.class).hasMessageContaining("profile.json is missing");
        ObjectNode versioned = TestBundles.manifest().put("format_version", 2);
        assertThatThrownBy(() -> BundleArchive.toBytes(versioned, TestBundles.entries(6)))
                .isInstanceOf(IllegalArgumentException.class).hasMessageContaining("must not set format_version");
    }

    @Test
    void a_flipped_byte_in_an_entry_names_the_entry_and_says_checksum() {
        byte[] bundle = TestBundles.bundle(7);
        byte[] features = TestBundles.entries(7).get(BundleArchive.FEATURES);
        int at = indexOf(bundle, features) + 3;
        bundle[at] ^= 0x01;
        BundleException e = readFails(bundle);
        assertThat(e.code()).isEqualTo(BundleException.CHECKSUM);
        assertThat(e.getMessage()).contains("features.json").contains("checksum");
    }

    @Test
    void an_entry_replaced_with_a_valid_crc_still_fails_the_manifests_sha256() throws IOException {
        byte[] original = TestBundles.bundle(8);
        Map<String, byte[]> tampered = new LinkedHashMap<>();
        tampered.put(BundleArchive.MANIFEST, BundleArchive.read(original).manifestJson().getBytes(StandardCharsets.UTF_8));
        tampered.putAll(TestBundles.entries(8));
        byte[] weights = tampered.get(BundleArchive.WEIGHTS).clone();
        weights[0] ^= (byte) 0x80;
        tampered.put(BundleArchive.WEIGHTS, weights);
        BundleException e = readFails(jdkZip(tampered));
        assertThat(e.code()).isEqualTo(BundleException.CHECKSUM);
        assertThat(e.getMessage()).contains("weights.bin").contains("SHA-256 checksum mismatch");
    }

    @Test
    void a_duplicate_entry_is_refused() {
        byte[] bundle = rawBundle(9, List.of("manifest.json", "tokenizer.json", "tokenizer.json", "features.json", "weights.bin", "profile.json"));
        BundleException e = readFails(bundle);
        assertThat(e.code()).isEqualTo(BundleException.DUPLICATE_ENTRY);
        assertThat(e.getMessage()).contains("tokenizer.json appears twice");
    }

    @Test
    void entry_names_that_could_escape_a_directory_are_refused() {
        for (String name : List.of("../x", "..", "/etc/passwd", "a\\b", "C:x", "tok\0enizer.json", "sub/tokenizer.json")) {
            RawZip zip = new RawZip().add(BundleArchive.MANIFEST, manifestBytes(10)).add(name, new byte[] {1});
            BundleException e = readFails(zip.bytes());
            assertThat(e.code()).as(name).isEqualTo(BundleException.ENTRY_NAME);
            assertThat(e.getMessage()).as(name).contains("unsafe entry name");
        }
    }

    @Test
    void an_unknown_entry_name_is_refused_listing_the_known_ones() {
        RawZip zip = new RawZip().add(BundleArchive.MANIFEST, manifestBytes(11)).add("extra.bin", new byte[] {1});
        BundleException e = readFails(zip.bytes());
        assertThat(e.code()).isEqualTo(BundleException.ENTRY_NAME);
        assertThat(e.getMessage()).contains("unknown entry extra.bin").contains("weights.bin");
    }

    @Test
    void an_unknown_format_version_is_refused_naming_both_versions() {
        String manifest = new String(manifestBytes(12), StandardCharsets.UTF_8).replace("\"format_version\":1", "\"format_version\":7");
        byte[] bundle = rawBundle(12, manifest.getBytes(StandardCharsets.UTF_8), BundleArchive.ENTRY_ORDER);
        BundleException e = readFails(bundle);
        assertThat(e.code()).isEqualTo(BundleException.FORMAT_VERSION);
        assertThat(e.getMessage()).isEqualTo("unsupported bundle format version 7; this program reads 1 and 2");
    }

    @Test
    void every_truncation_of_a_bundle_is_refused_as_corrupt() {
        byte[] bundle = TestBundles.bundle(13);
        for (int length = 0; length < bundle.length; length++) {
            byte[] cut = java.util.Arrays.copyOf(bundle, length);
            BundleException e = readFails(cut);
            assertThat(e.code()).as("cut at %d", length).isIn(BundleException.CORRUPT);
        }
    }

    @Test
    void a_file_that_is_not_a_zip_is_refused_as_not_a_bundle() {
        BundleException e = readFails("name,label\nvalve,plumbing\n".getBytes(StandardCharsets.UTF_8));
        assertThat(e.code()).isEqualTo(BundleException.CORRUPT);
        assertThat(e.getMessage()).contains("not a bundle");
    }

    @Test
    void an_entry_that_declares_a_huge_size_is_refused_before_its_bytes_are_read() {
        RawZip zip = new RawZip().add(BundleArchive.MANIFEST, manifestBytes(14))
                .add(BundleArchive.TOKENIZER, new byte[16], 0xFFFF_FFF0L, 0);
        BundleException e = readFails(zip.bytes());
        assertThat(e.code()).isEqualTo(BundleException.TOO_LARGE);
        assertThat(e.getMessage()).contains("tokenizer.json").contains(String.valueOf(0xFFFF_FFF0L));
    }

    @Test
    void the_total_and_per_entry_caps_hold_for_entries_within_the_declared_sizes() {
        byte[] bundle = TestBundles.bundle(15);
        assertThat(catchThrowableOfType(BundleException.class,
                () -> BundleArchive.read(new ByteArrayInputStream(bundle), bundle.length - 1, 1 << 20)).code()).isEqualTo(BundleException.TOO_LARGE);
        assertThat(catchThrowableOfType(BundleException.class,
                () -> BundleArchive.read(new ByteArrayInputStream(bundle), 1 << 20, 40)).code()).isEqualTo(BundleException.TOO_LARGE);
        assertThat(BundleArchive.read(new ByteArrayInputStream(bundle), bundle.length, 1 << 20).entries()).hasSize(4);
    }

    @Test
    void a_deflated_entry_is_refused() {
        RawZip zip = new RawZip().add(BundleArchive.MANIFEST, manifestBytes(16)).add(BundleArchive.TOKENIZER, new byte[] {3, 0}, 2, 8);
        BundleException e = readFails(zip.bytes());
        assertThat(e.code()).isEqualTo(BundleException.CORRUPT);
        assertThat(e.getMessage()).contains("compression method 8");
    }

    @Test
    void the_manifest_must_come_first() {
        List<String> order = List.of("tokenizer.json", "manifest.json", "features.json", "weights.bin", "profile.json");
        BundleException e = readFails(rawBundle(17, order));
        assertThat(e.code()).isEqualTo(BundleException.CORRUPT);
        assertThat(e.getMessage()).contains("first entry must be manifest.json");
    }

    @Test
    void entries_out_of_order_are_refused() {
        List<String> order = List.of("manifest.json", "features.json", "tokenizer.json", "weights.bin", "profile.json");
        BundleException e = readFails(rawBundle(18, order));
        assertThat(e.code()).isEqualTo(BundleException.CORRUPT);
        assertThat(e.getMessage()).contains("tokenizer.json comes after features.json");
    }

    @Test
    void an_entry_the_manifest_does_not_list_is_refused_and_so_is_a_listed_one_that_is_absent() {
        List<String> withoutProfile = List.of("manifest.json", "tokenizer.json", "features.json", "weights.bin");
        BundleException missing = readFails(rawBundle(19, withoutProfile));
        assertThat(missing.code()).isEqualTo(BundleException.ENTRY_MISMATCH);
        assertThat(missing.getMessage()).isEqualTo("entry profile.json is missing though the manifest lists it");

        ObjectNode manifest = (ObjectNode) BundleArchive.read(TestBundles.bundle(19)).manifest().deepCopy();
        ((ObjectNode) manifest.get("entries")).remove(BundleArchive.PROFILE);
        byte[] manifestBytes = CanonicalJson.bytes(manifest);
        BundleException unlisted = readFails(rawBundle(19, manifestBytes, BundleArchive.ENTRY_ORDER));
        assertThat(unlisted.code()).isEqualTo(BundleException.ENTRY_MISMATCH);
        assertThat(unlisted.getMessage()).isEqualTo("entry profile.json is not listed in the manifest");
    }

    @Test
    void a_manifest_that_is_not_json_is_refused() {
        byte[] bundle = rawBundle(20, "{\"format_version\":1,".getBytes(StandardCharsets.UTF_8), BundleArchive.ENTRY_ORDER);
        BundleException e = readFails(bundle);
        assertThat(e.code()).isEqualTo(BundleException.MANIFEST);
        assertThat(e.getMessage()).contains("manifest.json is not valid JSON");
    }

    @Test
    void bytes_after_the_end_of_the_zip_are_refused() {
        byte[] bundle = TestBundles.bundle(21);
        byte[] longer = java.util.Arrays.copyOf(bundle, bundle.length + 1);
        assertThat(readFails(longer).code()).isEqualTo(BundleException.CORRUPT);
    }

    @Test
    void reading_a_file_names_it_in_the_message() throws IOException {
        Path file = dir.resolve("broken.pmb");
        Files.writeString(file, "not a zip");
        assertThatThrownBy(() -> BundleArchive.read(file))
                .isInstanceOf(BundleException.class).hasMessageStartingWith(file + ": not a bundle");
        Path absent = dir.resolve("absent.pmb");
        assertThatThrownBy(() -> BundleArchive.read(absent))
                .isInstanceOf(BundleException.class).hasMessage(absent + ": no such file");
        Files.write(file, TestBundles.bundle(22));
        assertThat(BundleArchive.read(file).entries()).hasSize(4);
    }

    private static BundleException readFails(byte[] bundle) {
        BundleException e = catchThrowableOfType(BundleException.class, () -> BundleArchive.read(bundle));
        assertThat(e).as("reading must fail with a BundleException").isNotNull();
        return e;
    }

    private static byte[] manifestBytes(long seed) {
        String text = BundleArchive.read(TestBundles.bundle(seed)).manifestJson() + "\n";
        return text.getBytes(StandardCharsets.UTF_8);
    }

    private static byte[] rawBundle(long seed, List<String> order) {
        return rawBundle(seed, manifestBytes(seed), order);
    }

    private static byte[] rawBundle(long seed, byte[] manifest, List<String> order) {
        Map<String, byte[]> entries = TestBundles.entries(seed);
        RawZip zip = new RawZip();
        for (String name : order) {
            zip.add(name, name.equals(BundleArchive.MANIFEST) ? manifest : entries.get(name));
        }
        return zip.bytes();
    }

    private static byte[] jdkZip(Map<String, byte[]> entries) throws IOException {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        try (ZipOutputStream zip = new ZipOutputStream(out)) {
            zip.setMethod(ZipOutputStream.STORED);
            for (Map.Entry<String, byte[]> entry : entries.entrySet()) {
                ZipEntry e = new ZipEntry(entry.getKey());
                e.setSize(entry.getValue().length);
                java.util.zip.CRC32 crc = new java.util.zip.CRC32();
                crc.update(entry.getValue());
                e.setCrc(crc.getValue());
                zip.putNextEntry(e);
                zip.write(entry.getValue());
                zip.closeEntry();
            }
        }
        return out.toByteArray();
    }

    private static String manifestText(byte[] bundle) throws IOException {
        try (java.util.zip.ZipInputStream zip = new java.util.zip.ZipInputStream(new ByteArrayInputStream(bundle))) {
            ZipEntry first = zip.getNextEntry();
            assertThat(first.getName()).isEqualTo(BundleArchive.MANIFEST);
            return new String(zip.readAllBytes(), StandardCharsets.UTF_8);
        }
    }

    private static int indexOf(byte[] haystack, byte[] needle) {
        outer:
        for (int i = 0; i + needle.length <= haystack.length; i++) {
            for (int j = 0; j < needle.length; j++) {
                if (haystack[i + j] != needle[j]) {
                    continue outer;
                }
            }
            return i;
        }
        throw new AssertionError("not found");
    }
}
