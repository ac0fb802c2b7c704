package dev.pressmark.core.train;

import com.fasterxml.jackson.annotation.JsonCreator;
import com.fasterxml.jackson.annotation.JsonInclude;
import com.fasterxml.jackson.annotation.JsonProperty;
import com.fasterxml.jackson.annotation.JsonPropertyOrder;
import java.nio.file.Path;
import java.util.HashSet;
import java.util.List;
import java.util.Objects;

/**
 * The {@code data} section: which CSV file, which columns hold text and label.
 *
 * @param file the CSV file; relative paths are resolved against the config file's directory
 * @param text one or more text columns; features are named {@code column:token}
 * @param label the label column
 * @param positive the positive class for binary metrics, or null for the second label in sorted order
 * @param dropIncomplete leave out rows without label or text instead of failing on the first
 * @param group the column whose equal values make rows one group (kept on one side of the split and
 *     in one fold), or null for rows that are independent; a row whose group value is empty is a
 *     group of its own
 * @param weight the column that holds each row's case weight (a finite number {@code >= 0}), or
 *     null for every row weighing 1; a row's cost in the solvers is {@code C × class weight × case
 *     weight}, and every metric sums case weights where it would count rows
 * @param duplicates what to do with rows whose normalised texts are identical: keep them (the
 *     default; they are only counted), group them, or drop the repeats
 */
@JsonPropertyOrder({"file", "text", "label", "positive", "drop_incomplete", "group", "weight", "duplicates"})
public record DataConfig(
        @JsonProperty("file") String file,
        @JsonProperty("text") List<String> text,
        @JsonProperty("label") String label,
        @JsonProperty("positive") String positive,
        @JsonProperty("drop_incomplete") boolean dropIncomplete,
        @JsonProperty("group") @JsonInclude(JsonInclude.Include.NON_NULL) String group,
        @JsonProperty("weight") @JsonInclude(JsonInclude.Include.NON_NULL) String weight,
        // absent from the manifest's config when keep, so that a config without the key writes the manifest it always did
        @JsonProperty("duplicates") @JsonInclude(value = JsonInclude.Include.CUSTOM, valueFilter = DuplicatesMode.KeepFilter.class)
        DuplicatesMode duplicates) {

    public static final String DEFAULT_FILE = "data.csv";
    public static final List<String> DEFAULT_TEXT = List.of("text");
    public static final String DEFAULT_LABEL = "label";
    public static final DataConfig DEFAULT = new DataConfig(DEFAULT_FILE, DEFAULT_TEXT, DEFAULT_LABEL, null, false);

    /** A config whose rows are independent (no {@code group}). */
    public DataConfig(String file, List<String> text, String label, String positive, boolean dropIncomplete) {
        this(file, text, label, positive, dropIncomplete, null, null, DuplicatesMode.DEFAULT);
    }

    /** A config without case weights ({@code weight} null). */
    public DataConfig(String file, List<String> text, String label, String positive, boolean dropIncomplete, String group) {
        this(file, text, label, positive, dropIncomplete, group, null);
    }

    /** A config that keeps duplicate texts ({@code duplicates: keep}). */
    public DataConfig(String file, List<String> text, String label, String positive, boolean dropIncomplete, String group,
                      String weight) {
        this(file, text, label, positive, dropIncomplete, group, weight, DuplicatesMode.DEFAULT);
    }

    public DataConfig {
        Objects.requireNonNull(file, "data.file");
        Objects.requireNonNull(duplicates, "data.duplicates");
        if (file.isBlank()) {
            throw new IllegalArgumentException("data.file must name a CSV file, was empty");
        }
        for (String column : text) {
            if (column == null) {
                throw new IllegalArgumentException("data.text must name columns, but has an empty (null) entry: " + text);
            }
        }
        text = List.copyOf(text);
        if (text.isEmpty()) {
            throw new IllegalArgumentException("data.text must name at least one column, was an empty list");
        }
        if (new HashSet<>(text).size() != text.size()) {
            throw new IllegalArgumentException("data.text must not name a column twice, was " + text);
        }
        Objects.requireNonNull(label, "data.label");
        if (text.contains(label)) {
            throw new IllegalArgumentException("data.label \"" + label + "\" must not also be a text column");
        }
        if (group != null && group.isBlank()) {
            throw new IllegalArgumentException("data.group must name a column, was empty");
        }
        if (label.equals(group)) {
            throw new IllegalArgumentException("data.group \"" + group + "\" must not be the label column");
        }
        if (weight != null && weight.isBlank()) {
            throw new IllegalArgumentException("data.weight must name a column, was empty");
        }
        if (weight != null && (weight.equals(label) || text.contains(weight))) {
            throw new IllegalArgumentException("data.weight \"" + weight + "\" must not be the label column or a text column");
        }
    }

    @JsonCreator
    static DataConfig fromYaml(
            @JsonProperty("file") String file,
            @JsonProperty("text") List<String> text,
            @JsonProperty("label") String label,
            @JsonProperty("positive") String positive,
            @JsonProperty("drop_incomplete") Boolean dropIncomplete,
            @JsonProperty("group") String group,
            @JsonProperty("weight") String weight,
            @JsonProperty("duplicates") String duplicates) {
        return new DataConfig(
                file == null ? DEFAULT_FILE : file,
                text == null ? DEFAULT_TEXT : text,
                label == null ? DEFAULT_LABEL : label,
                positive,
                dropIncomplete != null && dropIncomplete,
                group,
                weight,
                duplicates == null ? DuplicatesMode.DEFAULT : DuplicatesMode.fromKey(duplicates));
    }

    /** This config with {@code duplicates} set to {@code mode}. */
    public DataConfig withDuplicates(DuplicatesMode mode) {
        return new DataConfig(file, text, label, positive, dropIncomplete, group, weight, mode);
    }

    /** The file as a path, resolved against {@code base} when relative. */
    public Path path(Path base) {
        Path path = Path.of(file);
        return path.isAbsolute() || base == null ? path : base.resolve(path).normalize();
    }

    DataConfig resolvedAgainst(Path base) {
        return new DataConfig(path(base).toString(), text, label, positive, dropIncomplete, group, weight, duplicates);
    }
}
