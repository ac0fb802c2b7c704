package dev.pressmark.core.bundle;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import com.fasterxml.jackson.databind.node.JsonNodeFactory;
import com.fasterxml.jackson.databind.node.ObjectNode;
import dev.pressmark.core.classify.PlattScaling;
import dev.pressmark.core.evaluate.DuplicateCounts;
import dev.pressmark.core.evaluate.Metric;
import dev.pressmark.core.search.Pick;
import dev.pressmark.core.search.SearchSummary;
import java.nio.charset.StandardCharsets;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.OptionalDouble;
import java.util.OptionalInt;
import java.util.SortedMap;
import java.util.TreeMap;
import net.jqwik.api.Arbitraries;
import net.jqwik.api.Arbitrary;
import net.jqwik.api.Combinators;
import net.jqwik.api.Example;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.Provide;

/** The manifest's reader and writer are inverse: any manifest written, read and written again gives the same bytes and record. */
class ManifestPropertiesTest {

    @Property(tries = 300)
    void a_written_manifest_reads_back_as_the_same_record_and_writes_the_same_bytes(@ForAll("manifests") Manifest manifest) {
        byte[] written = manifest.toBytes();
        Manifest read = Manifest.parse(new String(written, StandardCharsets.UTF_8));
        assertThat(read).isEqualTo(manifest);
        assertThat(read.toBytes()).isEqualTo(written);
    }

    @Example
    void a_format_version_the_reader_does_not_know_is_refused_naming_it() {
        assertThatThrownBy(() -> Manifest.parse("{\"name\":\"routing\",\"format_version\":3,\"entries\":{}}"))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessage("manifest format_version 3 is not one this reader knows; it reads 1 and 2");
    }

    @Example
    void a_manifest_of_an_archive_that_is_not_a_model_reads_with_its_parts_empty() {
        Manifest manifest = Manifest.parse("{\"name\":\"routing\"}");
        assertThat(manifest).isEqualTo(Manifest.named("routing"));
        assertThat(manifest.labels()).isEmpty();
        assertThat(manifest.metrics()).isEmpty();
        assertThat(manifest.search()).isEmpty();
        assertThat(new String(manifest.toBytes(), StandardCharsets.UTF_8)).isEqualTo("{\"name\":\"routing\"}\n");
    }

    @Provide
    Arbitrary<Manifest> manifests() {
        return Combinators.combine(Arbitraries.strings().ofMaxLength(12),
                Arbitraries.strings().alpha().ofMinLength(1).ofMaxLength(6).list().ofMinSize(2).ofMaxSize(4).uniqueElements(),
                doubles(), Arbitraries.longs(), Arbitraries.integers().between(0, 1_000_000), Arbitraries.integers().between(0, 31))
                .as((name, labels, value, seed, count, presence) -> new Parts(name, labels, value, seed, count, presence).manifest());
    }

    private static Arbitrary<Double> doubles() {
        return Arbitraries.oneOf(Arbitraries.doubles().withSpecialValue(Double.NaN).withSpecialValue(-0.0),
                Arbitraries.of(0.0, 1.0, 1e-9, 0.1 + 0.2, Double.MIN_VALUE, Double.MAX_VALUE));
    }

    /** Generated values, spread over a manifest; {@code presence}'s bits choose which optional parts it has. */
    record Parts(String name, List<String> labels, double value, long seed, int count, int presence) {

        boolean has(int bit) {
            return (presence & (1 << bit)) != 0;
        }

        Manifest manifest() {
            int k = labels.size();
            ObjectNode config = JsonNodeFactory.instance.objectNode().put("name", name);
            config.putObject("data").put("label", "department").put("file", "listings.csv");
            config.putObject("split").put("seed", count);
            Manifest.Provenance provenance = new Manifest.Provenance("pressmark test", "Java " + count, "os", seed, "ab".repeat(32),
                    name + ".csv", config);
            Manifest.Training training = new Manifest.Training(count, count % 7, count / 2, count - count / 2,
                    has(0) ? OptionalInt.of(count % 50) : OptionalInt.empty(), has(1) ? OptionalDouble.of(value) : OptionalDouble.empty(),
                    count % 999, count % 777, has(2) ? List.of("fold 1: " + name) : List.of());
            SortedMap<String, Manifest.CvScore> cv = new TreeMap<>();
            SortedMap<String, Double> test = new TreeMap<>();
            for (Metric metric : List.of(Metric.ACCURACY, Metric.BALANCED_ACCURACY)) {
                cv.put(metric.key(), new Manifest.CvScore(value, Math.abs(value) / 3, List.of(value, -value, 0.5)));
                test.put(metric.key(), value / 2);
            }
            SortedMap<String, SortedMap<String, Double>> perClass = new TreeMap<>();
            for (String label : labels) {
                perClass.put(label, new TreeMap<>(Map.of("f1", value)));
            }
            List<List<Long>> counts = labels.stream().map(l -> List.of((long) count, 0L)).toList();
            List<List<Double>> weights = labels.stream().map(l -> List.of(value, 2.5)).toList();
            Manifest.Metrics metrics = new Manifest.Metrics(cv, test, has(3) ? Optional.of(perClass) : Optional.empty(),
                    Optional.of(new Manifest.Confusion(counts, has(4) ? Optional.of(weights) : Optional.empty())));
            Optional<SearchSummary> search = has(2) ? Optional.of(new SearchSummary(Metric.ACCURACY, Pick.ONE_SE,
                    List.of(new SearchSummary.Scored(Map.of("classifier.c", JsonNodeFactory.instance.numberNode(count)), value, 0.25)), 0))
                    : Optional.empty();
            List<PlattScaling> platt = has(1) ? labels.stream().map(l -> new PlattScaling(Double.isFinite(value) ? -value : -1.0, 0.5)).toList() : List.of();
            Manifest manifest = Manifest.trained(name, "2026-01-01T00:00:00Z", k == 2 ? Optional.of(labels.get(1)) : Optional.empty(),
                    provenance, training, metrics, Manifest.Sections.NONE.with(Manifest.SEARCH, search)
                            .with(Manifest.DUPLICATES, has(3) ? Optional.of(duplicates()) : Optional.empty()))
                    .withModel(labels, List.of("title", name + "_body"), new Manifest.Classifier(ModelWeights.LINEAR_SVM, !platt.isEmpty(), platt));
            return has(0) ? manifest.withListing(Optional.of(new Manifest.Listing(2, new TreeMap<>(Map.of(BundleArchive.WEIGHTS,
                    new Manifest.Listing.Listed("cd".repeat(32), count)))))) : manifest;
        }

        /** Duplicate counts under one of the three settings, every tally with at most as many texts as rows. */
        DuplicateCounts duplicates() {
            String setting = List.of("keep", "group", "drop").get(count % 3);
            return new DuplicateCounts(setting, setting.equals("drop") ? count % 13 : 0, tally(11), tally(7), tally(5), tally(3));
        }

        private DuplicateCounts.Tally tally(int bound) {
            return new DuplicateCounts.Tally(count % bound, count % bound + count % 17);
        }
    }
}
