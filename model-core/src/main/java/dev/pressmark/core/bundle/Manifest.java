package dev.pressmark.core.bundle;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.JsonNodeFactory;
import com.fasterxml.jackson.databind.node.ObjectNode;
import dev.pressmark.core.classify.PlattScaling;
import dev.pressmark.core.evaluate.DuplicateCounts;
import dev.pressmark.core.search.SearchSummary;
import java.util.ArrayList;
import java.util.Collections;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.Optional;
import java.util.OptionalDouble;
import java.util.OptionalInt;
import java.util.SortedMap;
import java.util.TreeMap;
import java.util.function.Function;

/**
 * A bundle's {@code manifest.json}: what the bundle is (name, labels, input fields, classifier),
 * how it was made (provenance, training figures) and how good it is (metrics, search). This record
 * is the one reader ({@link #read}) and the one writer ({@link #toJson}) of that object; nothing
 * else names its fields. The written tree, made canonical, is byte for byte what was read.
 *
 * <p>Only a bundle made by training has every part. An archive that is not a model (a test's, a
 * damaged one) may lack any of them, so each part a trained bundle adds is optional: absent parts
 * read as empty and are not written. An optional top-level object with a type of its own (one that
 * reads and writes itself, as {@link SearchSummary} does) is a {@link Section}: adding one is one
 * constant, listed in {@link #SECTIONS}; the reader and writer need no other change.
 *
 * <p>The manifest's version is the bundle format's ({@code format_version}, in {@link #listing});
 * the reader rejects one it does not know, naming it and the ones it reads.
 *
 * @param name the model's name ({@code ""} when the manifest has none)
 * @param created when it was trained, ISO-8601, as written (empty when not recorded)
 * @param positiveLabel the label binary metrics treat as positive; empty with more than two labels
 * @param labels the label set, in score order (empty when the archive is not a model)
 * @param inputFields the text fields an item carries, in feature order (empty likewise)
 * @param classifier the classifier's kind and sigmoids (empty likewise)
 * @param provenance how the bundle was made (empty when not trained by this program)
 * @param training the training figures (empty likewise)
 * @param metrics cross-validated and test metrics (empty likewise)
 * @param sections the optional top-level objects that have a type of their own ({@link #SEARCH},
 *     {@link #DUPLICATES}), each present only when training recorded it
 * @param listing the format version and the entries' checksums, which the archive writer adds;
 *     empty before the bundle is written
 */
public record Manifest(
        String name,
        Optional<String> created,
        Optional<String> positiveLabel,
        List<String> labels,
        List<String> inputFields,
        Optional<Classifier> classifier,
        Optional<Provenance> provenance,
        Optional<Training> training,
        Optional<Metrics> metrics,
        Sections sections,
        Optional<Listing> listing) {

    /** The manifest format this reader and writer know: the bundle format's version. */
    public static final int VERSION = BundleArchive.FORMAT_VERSION;

    private static final JsonNodeFactory NODES = JsonNodeFactory.instance;

    public Manifest {
        Objects.requireNonNull(name, "name");
        Objects.requireNonNull(created, "created");
        Objects.requireNonNull(positiveLabel, "positiveLabel");
        labels = List.copyOf(labels);
        inputFields = List.copyOf(inputFields);
        Objects.requireNonNull(classifier, "classifier");
        Objects.requireNonNull(provenance, "provenance");
        Objects.requireNonNull(training, "training");
        Objects.requireNonNull(metrics, "metrics");
        Objects.requireNonNull(sections, "sections");
        Objects.requireNonNull(listing, "listing");
    }

    /** A manifest with a name and nothing else, for an archive made by hand. */
    public static Manifest named(String name) {
        return new Manifest(name, Optional.empty(), Optional.empty(), List.of(), List.of(), Optional.empty(), Optional.empty(),
                Optional.empty(), Optional.empty(), Sections.NONE, Optional.empty());
    }

    /**
     * What training records about a bundle, before the model's own parts ({@link #withModel}) and
     * the archive's listing are added.
     */
    public static Manifest trained(String name, String created, Optional<String> positiveLabel, Provenance provenance, Training training,
            Metrics metrics, Sections sections) {
        return new Manifest(name, Optional.of(created), positiveLabel, List.of(), List.of(), Optional.empty(), Optional.of(provenance),
                Optional.of(training), Optional.of(metrics), sections, Optional.empty());
    }

    /** This manifest with the model's labels, input fields and classifier. */
    public Manifest withModel(List<String> labels, List<String> inputFields, Classifier classifier) {
        return new Manifest(name, created, positiveLabel, labels, inputFields, Optional.of(classifier), provenance, training, metrics,
                sections, listing);
    }

    /** This manifest with {@code listing} in place of its own. */
    public Manifest withListing(Optional<Listing> listing) {
        return new Manifest(name, created, positiveLabel, labels, inputFields, classifier, provenance, training, metrics, sections,
                listing);
    }

    /** Reads a manifest; a part of the wrong shape is an {@link IllegalArgumentException} naming its field. */
    public static Manifest read(JsonNode node) {
        if (node == null || !node.isObject()) {
            throw new IllegalArgumentException("a manifest must be a JSON object");
        }
        return new Manifest(
                node.path("name").asText(),
                text(node, "created"),
                text(node, "positive_label"),
                strings(node.path("labels"), "labels"),
                strings(node.path("input_fields"), "input_fields"),
                object(node, "classifier").map(Classifier::read),
                object(node, "provenance").map(Provenance::read),
                object(node, "training").map(Training::read),
                object(node, "metrics").map(Metrics::read),
                Sections.read(node),
                Listing.read(node));
    }

    /** Reads a manifest kept as JSON text, as the store keeps it. */
    public static Manifest parse(String json) {
        try {
            return read(CanonicalJson.MAPPER.readTree(json));
        } catch (JsonProcessingException e) {
            throw new IllegalArgumentException("a manifest must be JSON: " + e.getOriginalMessage(), e);
        }
    }

    /** The manifest as a JSON tree, keys sorted as the canonical form has them. */
    public ObjectNode toJson() {
        ObjectNode node = NODES.objectNode();
        node.put("name", name);
        created.ifPresent(value -> node.put("created", value));
        positiveLabel.ifPresent(value -> node.put("positive_label", value));
        if (!labels.isEmpty()) {
            node.set("labels", array(labels));
        }
        if (!inputFields.isEmpty()) {
            node.set("input_fields", array(inputFields));
        }
        classifier.ifPresent(value -> node.set("classifier", value.toJson()));
        provenance.ifPresent(value -> node.set("provenance", value.toJson()));
        training.ifPresent(value -> node.set("training", value.toJson()));
        metrics.ifPresent(value -> node.set("metrics", value.toJson()));
        sections.writeInto(node);
        listing.ifPresent(value -> value.writeInto(node));
        return (ObjectNode) CanonicalJson.sorted(node);
    }

    /** What a model search found; empty when the config had no search. */
    public Optional<SearchSummary> search() {
        return sections.get(SEARCH);
    }

    /** The duplicate texts' counts; empty for a bundle trained before they were recorded. */
    public Optional<DuplicateCounts> duplicates() {
        return sections.get(DUPLICATES);
    }

    /** The search part as JSON with its keys sorted, as the manifest holds it; empty without a search. */
    public Optional<ObjectNode> searchJson() {
        return search().map(value -> (ObjectNode) CanonicalJson.sorted(value.toJson()));
    }

    /**
     * An optional top-level object of the manifest with a type of its own, which reads and writes
     * itself.
     *
     * @param key its key in the manifest
     * @param reader reads it from its JSON object
     * @param writer writes it as a JSON object
     */
    public record Section<T>(String key, Function<JsonNode, T> reader, Function<T, ? extends JsonNode> writer) {

        public Section {
            Objects.requireNonNull(key, "key");
            Objects.requireNonNull(reader, "reader");
            Objects.requireNonNull(writer, "writer");
        }
    }

    /** What a model search found: every candidate's score and the chosen one. */
    public static final Section<SearchSummary> SEARCH = new Section<>(SearchSummary.KEY, SearchSummary::fromJson, SearchSummary::toJson);

    /** How often the rows of each part repeat a normalised text, and what {@code data.duplicates} did about it. */
    public static final Section<DuplicateCounts> DUPLICATES =
            new Section<>(DuplicateCounts.KEY, DuplicateCounts::fromJson, DuplicateCounts::toJson);

    /** Every section a manifest may hold. A new optional object is one constant above, named here. */
    static final List<Section<?>> SECTIONS = List.of(SEARCH, DUPLICATES);

    /**
     * The sections a manifest holds, by key; each value is of its {@link Section}'s type.
     *
     * @param values section key to value; a key absent is a section not recorded
     */
    public record Sections(Map<String, Object> values) {

        /** No section at all. */
        public static final Sections NONE = new Sections(Map.of());

        public Sections {
            values = Collections.unmodifiableMap(new TreeMap<>(values));
        }

        /** These sections with {@code section} set to {@code value}, or removed when {@code value} is empty. */
        public <T> Sections with(Section<T> section, Optional<T> value) {
            Map<String, Object> copy = new TreeMap<>(values);
            value.ifPresentOrElse(v -> copy.put(section.key(), v), () -> copy.remove(section.key()));
            return new Sections(copy);
        }

        /** The value of {@code section}; empty when not recorded. */
        public <T> Optional<T> get(Section<T> section) {
            @SuppressWarnings("unchecked") // with() and read() store only a section's own type under its key
            T value = (T) values.get(section.key());
            return Optional.ofNullable(value);
        }

        static Sections read(JsonNode manifest) {
            Sections sections = NONE;
            for (Section<?> section : SECTIONS) {
                sections = sections.readOne(manifest, section);
            }
            return sections;
        }

        private <T> Sections readOne(JsonNode manifest, Section<T> section) {
            return with(section, object(manifest, section.key()).map(section.reader()));
        }

        void writeInto(ObjectNode manifest) {
            for (Section<?> section : SECTIONS) {
                writeOne(manifest, section);
            }
        }

        private <T> void writeOne(ObjectNode manifest, Section<T> section) {
            get(section).ifPresent(value -> manifest.set(section.key(), section.writer().apply(value)));
        }
    }

    /** {@link #toJson()} in the canonical form: the bytes of {@code manifest.json}. */
    public byte[] toBytes() {
        return CanonicalJson.bytes(toJson());
    }

    /**
     * The classifier's manifest part.
     *
     * @param kind {@value ModelWeights#LINEAR_SVM} or {@value ModelWeights#LOGISTIC_REGRESSION}
     * @param probabilities whether predictions carry probabilities
     * @param platt one sigmoid per score, or empty
     */
    public record Classifier(String kind, boolean probabilities, List<PlattScaling> platt) {

        public Classifier {
            Objects.requireNonNull(kind, "kind");
            platt = List.copyOf(platt);
        }

        /** The part that describes {@code model}. */
        public static Classifier of(ModelWeights model) {
            return new Classifier(model.kind(), model.hasProbabilities(), model.platt());
        }

        static Classifier read(JsonNode node) {
            List<PlattScaling> platt = new ArrayList<>();
            for (JsonNode sigmoid : node.path("platt")) {
                platt.add(new PlattScaling(sigmoid.path("a").asDouble(), sigmoid.path("b").asDouble()));
            }
            return new Classifier(node.path("kind").asText(), node.path("probabilities").asBoolean(), platt);
        }

        ObjectNode toJson() {
            ObjectNode node = NODES.objectNode().put("kind", kind).put("probabilities", probabilities);
            ArrayNode sigmoids = node.putArray("platt");
            for (PlattScaling scaling : platt) {
                sigmoids.addObject().put("a", scaling.a()).put("b", scaling.b());
            }
            return node;
        }
    }

    /**
     * How a bundle was made.
     *
     * @param library this program's name and version
     * @param java the Java vendor and version that trained it
     * @param os the operating system's name, version and architecture
     * @param seed the seed of every random choice of the run
     * @param dataSha256 the SHA-256 of the training data file
     * @param dataFile the training data file's name
     * @param config the resolved training config; its shape is the training config's own, which
     *     {@code TrainConfig} reads and writes, so the manifest keeps it as that tree
     */
    public record Provenance(String library, String java, String os, long seed, String dataSha256, String dataFile, JsonNode config) {

        /** The config's label column when it records one, else {@code fallback}. */
        public String labelColumn(String fallback) {
            return config.path("data").path("label").asText(fallback);
        }

        public Provenance {
            Objects.requireNonNull(library, "library");
            Objects.requireNonNull(java, "java");
            Objects.requireNonNull(os, "os");
            Objects.requireNonNull(dataSha256, "dataSha256");
            Objects.requireNonNull(dataFile, "dataFile");
            config = config.deepCopy();
        }

        static Provenance read(JsonNode node) {
            return new Provenance(node.path("library").asText(), node.path("java").asText(), node.path("os").asText(),
                    node.path("seed").asLong(), node.path("data_sha256").asText(), node.path("data_file").asText(),
                    node.path("config"));
        }

        /** This part as JSON, keys sorted. */
        public ObjectNode toJson() {
            ObjectNode node = NODES.objectNode();
            node.put("library", library).put("java", java).put("os", os).put("seed", seed).put("data_sha256", dataSha256)
                    .put("data_file", dataFile);
            if (!config.isMissingNode()) {
                node.set("config", config.deepCopy());
            }
            return (ObjectNode) CanonicalJson.sorted(node);
        }
    }

    /**
     * The training figures.
     *
     * @param rows the data rows read
     * @param droppedRows incomplete rows left out
     * @param trainRows rows in the training part
     * @param testRows rows in the test part
     * @param groups the distinct groups, recorded only with {@code data.group} or
     *     {@code data.duplicates: group} (then the groups joined with those of identical texts)
     * @param testFractionAchieved the test part's share of the rows, recorded only with groups
     *     when the test part was held out (not given as a file)
     * @param features the model's features
     * @param vocabularySize the tokenizers' vocabulary size
     * @param warnings solver and grouping warnings
     */
    public record Training(int rows, int droppedRows, int trainRows, int testRows, OptionalInt groups, OptionalDouble testFractionAchieved,
            int features, int vocabularySize, List<String> warnings) {

        public Training {
            Objects.requireNonNull(groups, "groups");
            Objects.requireNonNull(testFractionAchieved, "testFractionAchieved");
            warnings = List.copyOf(warnings);
        }

        static Training read(JsonNode node) {
            return new Training(node.path("rows").asInt(), node.path("dropped_rows").asInt(), node.path("train_rows").asInt(),
                    node.path("test_rows").asInt(),
                    node.has("groups") ? OptionalInt.of(node.path("groups").asInt()) : OptionalInt.empty(),
                    node.has("test_fraction_achieved") ? OptionalDouble.of(number(node.path("test_fraction_achieved")))
                            : OptionalDouble.empty(),
                    node.path("features").asInt(), node.path("vocabulary_size").asInt(), strings(node.path("warnings"), "training.warnings"));
        }

        ObjectNode toJson() {
            ObjectNode node = NODES.objectNode().put("rows", rows).put("dropped_rows", droppedRows).put("train_rows", trainRows)
                    .put("test_rows", testRows);
            groups.ifPresent(value -> node.put("groups", value));
            testFractionAchieved.ifPresent(value -> node.put("test_fraction_achieved", value));
            node.put("features", features).put("vocabulary_size", vocabularySize);
            node.set("warnings", array(warnings));
            return node;
        }
    }

    /**
     * A metric's cross-validated score.
     *
     * @param mean the mean over the folds
     * @param standardError its standard error
     * @param perFold each fold's value, in fold order
     */
    public record CvScore(double mean, double standardError, List<Double> perFold) {

        public CvScore {
            perFold = List.copyOf(perFold);
        }

        static CvScore read(JsonNode node) {
            List<Double> perFold = new ArrayList<>();
            node.path("per_fold").forEach(value -> perFold.add(number(value)));
            return new CvScore(number(node.path("mean")), number(node.path("std_err")), perFold);
        }

        ObjectNode toJson() {
            ObjectNode node = NODES.objectNode().put("mean", mean).put("std_err", standardError);
            ArrayNode folds = node.putArray("per_fold");
            perFold.forEach(folds::add);
            return node;
        }
    }

    /**
     * The test part's confusion matrix.
     *
     * @param counts rows of weight &gt; 0 by true label (row) and predicted label (column)
     * @param weights the case weights summed the same way; recorded only with {@code data.weight}
     */
    public record Confusion(List<List<Long>> counts, Optional<List<List<Double>>> weights) {

        public Confusion {
            counts = counts.stream().map(List::copyOf).toList();
            weights = weights.map(rows -> rows.stream().map(List::copyOf).toList());
        }

        /** The count of true label {@code truth} predicted as {@code predicted}; 0 outside the matrix. */
        public long count(int truth, int predicted) {
            return truth < counts.size() && predicted < counts.get(truth).size() ? counts.get(truth).get(predicted) : 0;
        }

        static Confusion read(JsonNode node) {
            List<List<Long>> counts = new ArrayList<>();
            for (JsonNode row : node.path("counts")) {
                List<Long> values = new ArrayList<>();
                row.forEach(value -> values.add(value.asLong()));
                counts.add(values);
            }
            Optional<List<List<Double>>> weights = Optional.empty();
            if (node.has("weights")) {
                List<List<Double>> sums = new ArrayList<>();
                for (JsonNode row : node.path("weights")) {
                    List<Double> values = new ArrayList<>();
                    row.forEach(value -> values.add(number(value)));
                    sums.add(values);
                }
                weights = Optional.of(sums);
            }
            return new Confusion(counts, weights);
        }

        ObjectNode toJson() {
            ObjectNode node = NODES.objectNode();
            ArrayNode rows = node.putArray("counts");
            for (List<Long> row : counts) {
                ArrayNode values = rows.addArray();
                row.forEach(values::add);
            }
            weights.ifPresent(sums -> {
                ArrayNode array = node.putArray("weights");
                for (List<Double> row : sums) {
                    ArrayNode values = array.addArray();
                    row.forEach(values::add);
                }
            });
            return node;
        }
    }

    /**
     * The metrics, by metric key; maps iterate in key order, as the canonical form lists them.
     *
     * @param cv each metric's cross-validated score
     * @param test each metric's value on the test part
     * @param testPerClass per label, each metric on the test part with that label as the positive
     *     one; recorded only with more than two labels
     * @param testConfusion the test part's confusion matrix
     */
    public record Metrics(SortedMap<String, CvScore> cv, SortedMap<String, Double> test,
            Optional<SortedMap<String, SortedMap<String, Double>>> testPerClass, Optional<Confusion> testConfusion) {

        /** No metrics at all. */
        public static final Metrics NONE = new Metrics(new TreeMap<>(), new TreeMap<>(), Optional.empty(), Optional.empty());

        public Metrics {
            cv = Collections.unmodifiableSortedMap(new TreeMap<>(cv));
            test = Collections.unmodifiableSortedMap(new TreeMap<>(test));
            Objects.requireNonNull(testPerClass, "testPerClass");
            Objects.requireNonNull(testConfusion, "testConfusion");
        }

        /** {@code test[metric]} when recorded and finite, else {@code cv[metric].mean} when that is, else empty. */
        public OptionalDouble value(String source, String metric) {
            Double value = source.equals("test") ? test.get(metric) : cv.containsKey(metric) ? cv.get(metric).mean() : null;
            return value != null && Double.isFinite(value) ? OptionalDouble.of(value) : OptionalDouble.empty();
        }

        static Metrics read(JsonNode node) {
            SortedMap<String, CvScore> cv = new TreeMap<>();
            node.path("cv").properties().forEach(field -> cv.put(field.getKey(), CvScore.read(field.getValue())));
            Optional<SortedMap<String, SortedMap<String, Double>>> perClass = object(node, "test_per_class").map(classes -> {
                SortedMap<String, SortedMap<String, Double>> map = new TreeMap<>();
                classes.properties().forEach(field -> map.put(field.getKey(), numbers(field.getValue())));
                return map;
            });
            return new Metrics(cv, numbers(node.path("test")), perClass, object(node, "test_confusion").map(Confusion::read));
        }

        /** This part as JSON, keys sorted. */
        public ObjectNode toJson() {
            ObjectNode node = NODES.objectNode();
            ObjectNode cvNode = node.putObject("cv");
            cv.forEach((key, score) -> cvNode.set(key, score.toJson()));
            node.set("test", values(test));
            testPerClass.ifPresent(classes -> {
                ObjectNode perClass = node.putObject("test_per_class");
                classes.forEach((label, values) -> perClass.set(label, values(values)));
            });
            testConfusion.ifPresent(confusion -> node.set("test_confusion", confusion.toJson()));
            return (ObjectNode) CanonicalJson.sorted(node);
        }

        private static ObjectNode values(Map<String, Double> values) {
            ObjectNode node = NODES.objectNode();
            values.forEach(node::put);
            return node;
        }

        private static SortedMap<String, Double> numbers(JsonNode node) {
            SortedMap<String, Double> values = new TreeMap<>();
            node.properties().forEach(field -> values.put(field.getKey(), number(field.getValue())));
            return values;
        }
    }

    /**
     * What the archive writer adds: the format version and each entry's checksum and size. The
     * archive reader checks both before this record sees them.
     *
     * @param formatVersion the bundle format version
     * @param entries each entry's SHA-256 and size, by entry name; empty when left out (for showing)
     */
    public record Listing(int formatVersion, SortedMap<String, Listed> entries) {

        public Listing {
            entries = Collections.unmodifiableSortedMap(new TreeMap<>(entries));
        }

        /** One entry's SHA-256 (64 lower-case hex digits) and size in bytes. */
        public record Listed(String sha256, long sizeBytes) {
        }

        /** This listing without the entries, as {@code inspect --json} shows a manifest. */
        public Listing withoutEntries() {
            return new Listing(formatVersion, new TreeMap<>());
        }

        static Optional<Listing> read(JsonNode manifest) {
            if (!manifest.has(BundleArchive.FORMAT_VERSION_FIELD)) {
                return Optional.empty();
            }
            int version = manifest.path(BundleArchive.FORMAT_VERSION_FIELD).asInt();
            if (version != BundleArchive.FORMAT_VERSION_1 && version != BundleArchive.FORMAT_VERSION) {
                throw new IllegalArgumentException("manifest format_version " + manifest.path(BundleArchive.FORMAT_VERSION_FIELD)
                        + " is not one this reader knows; it reads " + BundleArchive.FORMAT_VERSION_1 + " and " + BundleArchive.FORMAT_VERSION);
            }
            SortedMap<String, Listed> entries = new TreeMap<>();
            manifest.path(BundleArchive.ENTRIES_FIELD).properties().forEach(field -> entries.put(field.getKey(),
                    new Listed(field.getValue().path("sha256").asText(), field.getValue().path("size").asLong())));
            return Optional.of(new Listing(version, entries));
        }

        void writeInto(ObjectNode manifest) {
            manifest.put(BundleArchive.FORMAT_VERSION_FIELD, formatVersion);
            if (!entries.isEmpty()) {
                ObjectNode listed = manifest.putObject(BundleArchive.ENTRIES_FIELD);
                entries.forEach((name, entry) -> listed.putObject(name).put("sha256", entry.sha256()).put("size", entry.sizeBytes()));
            }
        }
    }

    private static Optional<String> text(JsonNode node, String key) {
        JsonNode value = node.get(key);
        return value == null || value.isNull() ? Optional.empty() : Optional.of(value.asText());
    }

    private static Optional<JsonNode> object(JsonNode node, String key) {
        JsonNode value = node.get(key);
        if (value == null || value.isNull()) {
            return Optional.empty();
        }
        if (!value.isObject()) {
            throw new IllegalArgumentException("manifest field " + key + " must be an object, was " + value.getNodeType());
        }
        return Optional.of(value);
    }

    private static List<String> strings(JsonNode array, String field) {
        if (array.isMissingNode() || array.isNull()) {
            return List.of();
        }
        if (!array.isArray()) {
            throw new IllegalArgumentException("manifest field " + field + " must be an array, was " + array.getNodeType());
        }
        List<String> values = new ArrayList<>(array.size());
        array.forEach(value -> values.add(value.asText()));
        return values;
    }

    /** A number as written: the canonical form writes a value that is not finite as a string ("NaN"). */
    private static double number(JsonNode value) {
        return value.isNumber() ? value.asDouble() : value.isTextual() ? value.asDouble(Double.NaN) : Double.NaN;
    }

    private static ArrayNode array(List<String> values) {
        ArrayNode array = NODES.arrayNode(values.size());
        values.forEach(array::add);
        return array;
    }
}
