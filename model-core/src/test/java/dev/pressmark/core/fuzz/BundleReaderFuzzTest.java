package dev.pressmark.core.fuzz;

import static org.assertj.core.api.Assertions.assertThat;

import com.code_intelligence.jazzer.junit.FuzzTest;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.node.ObjectNode;
import dev.pressmark.core.PressmarkException;
import dev.pressmark.core.bundle.Bundle;
import dev.pressmark.core.bundle.BundleArchive;
import dev.pressmark.core.bundle.BundleException;
import dev.pressmark.core.bundle.Explanation;
import dev.pressmark.core.bundle.Prediction;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.util.Arrays;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Tag;

/**
 * Hostile bundle files. A bundle comes from a user's disk or an upload, so reading one must either
 * give a model that predicts or fail with the project's own exception and a message; an
 * {@code OutOfMemoryError}, a {@code NullPointerException}, an index out of bounds, a stack
 * overflow or a hang is a bug.
 *
 * <p>Two targets, because the archive's checksums stop a byte-mutating fuzzer at the door: the
 * first feeds the bytes to {@link Bundle#read(byte[])} as they are and so tests the ZIP layer and
 * the manifest; the second takes the entries out of the (possibly damaged) file leniently,
 * re-archives them with matching checksums and so reaches the JSON, the weights and the model
 * behind them. The seeds (made by {@code scripts/fuzz-bundle-seeds.py}) are the frozen bundle of
 * format 1, a tiny valid bundle, and crafted files: a huge declared entry size, an entry named
 * {@code ../x}, duplicate entries, a deflated entry of 8 MiB of zeros, a truncated file; and, under
 * good checksums, weights whose header sizes overflow, NaN weights, bad feature statistics, bad
 * vocabularies, labels that do not match the weights.
 */
@Tag("slow") // Jazzer's agent instruments every class loaded after it (over 10 s); scripts/fuzz.sh fuzzes these
final class BundleReaderFuzzTest {

    private static final ObjectMapper JSON = new ObjectMapper();
    private static final List<String> TEXTS = List.of("", "free wins hi", "FREE free free ##s", "ünïcode 中文 \uD83D\uDE00 $5.99");
    private static final int K = 3;

    @FuzzTest(maxDuration = "30s")
    void any_bytes_load_as_a_bundle_or_fail_with_a_bundle_exception(byte[] bytes) {
        Bundle bundle;
        try {
            bundle = Bundle.read(bytes);
        } catch (BundleException e) {
            assertThat(e.getMessage()).isNotBlank();
            return;
        }
        predictsWithItsLabels(bundle);
    }

    @FuzzTest(maxDuration = "30s")
    void entries_under_matching_checksums_load_or_fail_with_a_pressmark_exception(byte[] bytes) {
        Map<String, byte[]> entries = LenientEntries.of(bytes);
        byte[] manifestBytes = entries.remove(BundleArchive.MANIFEST);
        if (manifestBytes == null) {
            return;
        }
        ObjectNode manifest;
        try {
            JsonNode parsed = JSON.readTree(manifestBytes);
            if (!(parsed instanceof ObjectNode object)) {
                return;
            }
            manifest = object;
        } catch (IOException e) {
            return; // a manifest that is not JSON is the first target's business
        }
        manifest.remove(BundleArchive.FORMAT_VERSION_FIELD);
        manifest.remove(BundleArchive.ENTRIES_FIELD);
        for (String name : BundleArchive.ENTRY_ORDER.subList(1, BundleArchive.ENTRY_ORDER.size())) {
            entries.putIfAbsent(name, new byte[0]);
        }
        Bundle bundle;
        try {
            bundle = Bundle.read(BundleArchive.toBytes(manifest, entries));
        } catch (PressmarkException e) {
            assertThat(e.getMessage()).isNotBlank();
            return;
        }
        predictsWithItsLabels(bundle);
    }

    /** A loaded bundle must serve: every prediction names one of its labels, every explanation has at most k parts. */
    private static void predictsWithItsLabels(Bundle bundle) {
        for (String text : TEXTS) {
            Map<String, String> item = new HashMap<>();
            for (String field : bundle.inputFields()) {
                item.put(field, text);
            }
            Prediction prediction = bundle.predict(item);
            assertThat(bundle.labels()).contains(prediction.label());
            assertThat(prediction.unknownTokens()).isNotNegative();
            Explanation explanation = bundle.explain(item, K);
            assertThat(explanation.contributions().size()).isLessThanOrEqualTo(K);
        }
    }

    /**
     * Takes the entries out of a ZIP file as its local headers say, trusting nothing else: no CRC,
     * no central directory, sizes clamped to the file. The first entry of each name wins.
     */
    static final class LenientEntries {

        private static final int LOCAL_SIGNATURE = 0x04034b50;
        private static final int LOCAL_HEADER_BYTES = 30;

        private LenientEntries() {
        }

        static Map<String, byte[]> of(byte[] zip) {
            Map<String, byte[]> entries = new LinkedHashMap<>();
            int position = 0;
            while (position + LOCAL_HEADER_BYTES <= zip.length && u32(zip, position) == LOCAL_SIGNATURE) {
                long size = u32(zip, position + 18) & 0xFFFFFFFFL;
                int nameLength = u16(zip, position + 26);
                int extraLength = u16(zip, position + 28);
                int dataStart = position + LOCAL_HEADER_BYTES + nameLength + extraLength;
                if (dataStart > zip.length) {
                    break;
                }
                int dataEnd = (int) Math.min(zip.length, dataStart + size);
                String name = new String(zip, position + LOCAL_HEADER_BYTES, nameLength, StandardCharsets.UTF_8);
                if (BundleArchive.ENTRY_ORDER.contains(name)) {
                    entries.putIfAbsent(name, Arrays.copyOfRange(zip, dataStart, dataEnd));
                }
                position = dataEnd;
            }
            return entries;
        }

        private static int u16(byte[] b, int at) {
            return (b[at] & 0xff) | (b[at + 1] & 0xff) << 8;
        }

        private static int u32(byte[] b, int at) {
            return u16(b, at) | u16(b, at + 2) << 16;
        }
    }
}
