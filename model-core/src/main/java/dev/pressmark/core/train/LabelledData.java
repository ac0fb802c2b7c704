package dev.pressmark.core.train;

import com.fasterxml.jackson.core.JsonParser;
import com.fasterxml.jackson.core.StreamReadConstraints;
import com.fasterxml.jackson.core.exc.StreamConstraintsException;
import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.core.JsonToken;
import com.fasterxml.jackson.dataformat.csv.CsvFactory;
import com.fasterxml.jackson.dataformat.csv.CsvMapper;
import com.fasterxml.jackson.dataformat.csv.CsvParser;
import dev.pressmark.core.PressmarkException;
import dev.pressmark.core.bundle.Sha256;
import dev.pressmark.core.io.InputFiles;
import dev.pressmark.core.io.StrictUtf8;
import java.io.IOException;
import java.io.StringReader;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Objects;

/**
 * Labelled rows read from a CSV file (RFC 4180: quoted fields, embedded newlines, CRLF, an
 * optional byte-order mark; strict UTF-8): one or more text columns and one label column, chosen
 * by the header. A row is incomplete when its label is empty or all its text columns are; the
 * first incomplete row is an error unless {@code dropIncomplete}, in which case such rows are
 * counted and left out. Immutable.
 *
 * @param textColumns the text columns, in the order features are named
 * @param labelColumn the label column
 * @param texts per row, the text of each text column
 * @param labels per row, the label
 * @param lines per row, the line of the file on which the row starts
 * @param sha256 the SHA-256 of the file's bytes, its fingerprint
 * @param droppedRows how many incomplete rows were left out
 * @param groups per row, the stripped value of the group column, or null when no group column was
 *     read; an empty value means the row is a group of its own
 * @param rowNumbers per row, its 1-based number among the file's data rows (header excluded,
 *     incomplete rows that were left out counted)
 * @param weights per row, its case weight (finite, {@code >= 0}), or null when no weight column
 *     was read and every row weighs 1
 */
public record LabelledData(
        List<String> textColumns,
        String labelColumn,
        List<String[]> texts,
        List<String> labels,
        int[] lines,
        String sha256,
        int droppedRows,
        List<String> groups,
        int[] rowNumbers,
        double[] weights) {

    /**
     * The longest field read: 8 Mi characters, far beyond a short text and below the parser's own
     * default cap, so that the limit and its message are ours.
     */
    public static final int MAX_FIELD_CHARS = 8 << 20;

    private static final CsvMapper CSV = CsvMapper.builder(CsvFactory.builder()
                    .streamReadConstraints(StreamReadConstraints.builder().maxStringLength(MAX_FIELD_CHARS).build())
                    .build())
            .enable(CsvParser.Feature.SKIP_EMPTY_LINES)
            .build();

    public LabelledData {
        textColumns = List.copyOf(textColumns);
        texts = List.copyOf(texts);
        labels = List.copyOf(labels);
        lines = lines.clone();
        if (texts.size() != labels.size() || lines.length != labels.size()) {
            throw new IllegalArgumentException("texts, labels and lines must have one entry per row, were "
                    + texts.size() + ", " + labels.size() + " and " + lines.length);
        }
        groups = groups == null ? null : List.copyOf(groups);
        if (groups != null && groups.size() != labels.size()) {
            throw new IllegalArgumentException("groups must have one entry per row (" + labels.size() + "), had " + groups.size());
        }
        rowNumbers = rowNumbers == null ? ordinals(labels.size()) : rowNumbers.clone();
        if (rowNumbers.length != labels.size()) {
            throw new IllegalArgumentException("rowNumbers must have one entry per row (" + labels.size() + "), had "
                    + rowNumbers.length);
        }
        weights = weights == null ? null : weights.clone();
        if (weights != null && weights.length != labels.size()) {
            throw new IllegalArgumentException("weights must have one entry per row (" + labels.size() + "), had " + weights.length);
        }
    }

    /** Rows without groups, numbered 1, 2, ... in order. */
    public LabelledData(List<String> textColumns, String labelColumn, List<String[]> texts, List<String> labels, int[] lines,
                        String sha256, int droppedRows) {
        this(textColumns, labelColumn, texts, labels, lines, sha256, droppedRows, null, null, null);
    }

    /** Rows with groups (or null) and without case weights. */
    public LabelledData(List<String> textColumns, String labelColumn, List<String[]> texts, List<String> labels, int[] lines,
                        String sha256, int droppedRows, List<String> groups, int[] rowNumbers) {
        this(textColumns, labelColumn, texts, labels, lines, sha256, droppedRows, groups, rowNumbers, null);
    }

    private static int[] ordinals(int count) {
        int[] out = new int[count];
        for (int i = 0; i < count; i++) {
            out[i] = i + 1;
        }
        return out;
    }

    /** Whether a group column was read. */
    public boolean hasGroups() {
        return groups != null;
    }

    /** Whether a weight column was read. */
    public boolean hasWeights() {
        return weights != null;
    }

    @Override
    public double[] weights() {
        return weights == null ? null : weights.clone();
    }

    @Override
    public int[] rowNumbers() {
        return rowNumbers.clone();
    }

    public int rows() {
        return labels.size();
    }

    /**
     * These rows followed by {@code more}'s, which must have the same text and label columns; used
     * to train on one file and test on another. The fingerprint becomes the SHA-256 of the two
     * files' fingerprints (hex, this one's first); the line and row numbers stay those of each
     * file. When these rows have groups and {@code more}'s do not, each of its rows is a group of
     * its own; when these rows have case weights and {@code more}'s do not, each of its rows weighs 1.
     */
    public LabelledData followedBy(LabelledData more) {
        if (!textColumns.equals(more.textColumns) || !Objects.equals(labelColumn, more.labelColumn)) {
            throw new IllegalArgumentException("more must have the text columns " + textColumns + " and the label column "
                    + labelColumn + ", had " + more.textColumns + " and " + more.labelColumn);
        }
        List<String[]> allTexts = new ArrayList<>(texts);
        allTexts.addAll(more.texts);
        List<String> allLabels = new ArrayList<>(labels);
        allLabels.addAll(more.labels);
        int[] allLines = Arrays.copyOf(lines, lines.length + more.lines.length);
        System.arraycopy(more.lines, 0, allLines, lines.length, more.lines.length);
        String fingerprint = Sha256.hex((sha256 + more.sha256).getBytes(StandardCharsets.US_ASCII));
        List<String> allGroups = null;
        if (groups != null) {
            // rows of more read without the group column are groups of their own, as empty values are
            allGroups = new ArrayList<>(groups);
            allGroups.addAll(more.groups != null ? more.groups : java.util.Collections.nCopies(more.rows(), ""));
        }
        int[] allNumbers = Arrays.copyOf(rowNumbers, rowNumbers.length + more.rowNumbers.length);
        System.arraycopy(more.rowNumbers, 0, allNumbers, rowNumbers.length, more.rowNumbers.length);
        double[] allWeights = null;
        if (weights != null) {
            allWeights = Arrays.copyOf(weights, weights.length + more.rows());
            if (more.weights != null) {
                System.arraycopy(more.weights, 0, allWeights, weights.length, more.rows());
            } else {
                Arrays.fill(allWeights, weights.length, allWeights.length, 1.0);
            }
        }
        return new LabelledData(textColumns, labelColumn, allTexts, allLabels, allLines, fingerprint,
                droppedRows + more.droppedRows, allGroups, allNumbers, allWeights);
    }

    /**
     * The rows at {@code indices} (ascending), with their groups, numbers and weights; the
     * fingerprint and the count of incomplete rows left out stay this file's.
     */
    public LabelledData rowsAt(int[] indices) {
        List<String[]> someTexts = new ArrayList<>(indices.length);
        List<String> someLabels = new ArrayList<>(indices.length);
        List<String> someGroups = groups == null ? null : new ArrayList<>(indices.length);
        int[] someLines = new int[indices.length];
        int[] someNumbers = new int[indices.length];
        double[] someWeights = weights == null ? null : new double[indices.length];
        for (int i = 0; i < indices.length; i++) {
            int row = indices[i];
            someTexts.add(texts.get(row));
            someLabels.add(labels.get(row));
            if (someGroups != null) {
                someGroups.add(groups.get(row));
            }
            someLines[i] = lines[row];
            someNumbers[i] = rowNumbers[row];
            if (someWeights != null) {
                someWeights[i] = weights[row];
            }
        }
        return new LabelledData(textColumns, labelColumn, someTexts, someLabels, someLines, sha256, droppedRows, someGroups,
                someNumbers, someWeights);
    }

    /** Reads the text columns of {@code file} without labels, for prediction; every row is kept. */
    public static LabelledData readTexts(Path file, List<String> textColumns) {
        return read(file, textColumns, null, null, null, false);
    }

    /** Reads {@code file} without a group column; errors name the file, and the line where one is at fault. */
    public static LabelledData read(Path file, List<String> textColumns, String labelColumn, boolean dropIncomplete) {
        return read(file, textColumns, labelColumn, null, null, dropIncomplete);
    }

    /**
     * Reads {@code file}, and the value of {@code groupColumn} (unless null) in every row; errors
     * name the file, and the line where one is at fault.
     */
    public static LabelledData read(Path file, List<String> textColumns, String labelColumn, String groupColumn,
                                    boolean dropIncomplete) {
        return read(file, textColumns, labelColumn, groupColumn, null, dropIncomplete);
    }

    /**
     * Reads {@code file} as {@code data} describes it: its text, label, group (when set) and weight
     * (when set) columns. The file is {@code file}, not {@code data.file()}, so that a test file
     * can be read with the same columns.
     */
    public static LabelledData read(Path file, DataConfig data) {
        return read(file, data.text(), data.label(), data.group(), data.weight(), data.dropIncomplete());
    }

    /**
     * Reads {@code file}, and the values of {@code groupColumn} and {@code weightColumn} (each unless
     * null) in every row; errors name the file, and the line where one is at fault. A case weight
     * must be a finite decimal number {@code >= 0}.
     */
    public static LabelledData read(Path file, List<String> textColumns, String labelColumn, String groupColumn,
                                    String weightColumn, boolean dropIncomplete) {
        byte[] bytes = InputFiles.readAllBytes(file);
        String text = StrictUtf8.decode(bytes, file.toString());
        FieldStart start = new FieldStart(text);
        try (JsonParser parser = CSV.createParser(new StringReader(text))) {
            return parse(parser, start, file, new Columns(textColumns, labelColumn, groupColumn, weightColumn), dropIncomplete, Sha256.hex(bytes));
        } catch (StreamConstraintsException e) {
            throw new PressmarkException("invalid-csv", String.format("%s: line %d: a field longer than %,d characters, the limit on one field"
                    + " (an unclosed quote makes the rest of the file one field)", file, start.line(), MAX_FIELD_CHARS), e);
        } catch (JsonProcessingException e) {
            String what = String.valueOf(e.getOriginalMessage()).startsWith("Missing closing quote")
                    ? "the quoted field that starts on this line has no closing quote" : e.getOriginalMessage();
            throw new PressmarkException("invalid-csv", file + ": line " + start.line() + ": " + what, e);
        } catch (IOException e) {
            throw new PressmarkException("file-unreadable", file + ": " + e.getMessage(), e);
        }
    }

    /** The columns to read: text columns, and the label, group and weight columns (each null when not read). */
    private record Columns(List<String> text, String label, String group, String weight) {
    }

    private static LabelledData parse(JsonParser parser, FieldStart start, Path file, Columns columns,
                                      boolean dropIncomplete, String sha256) throws IOException {
        List<String> textColumns = columns.text();
        String labelColumn = columns.label();
        List<String> fields = new ArrayList<>();
        int line = nextRow(parser, start, fields);
        if (line < 0) {
            throw new PressmarkException("empty-data", file + ": no header row; the file is empty");
        }
        List<String> header = List.copyOf(fields);
        int[] textIndex = new int[textColumns.size()];
        for (int i = 0; i < textIndex.length; i++) {
            textIndex[i] = column(header, textColumns.get(i), file);
        }
        int labelIndex = labelColumn == null ? -1 : column(header, labelColumn, file);
        int groupIndex = columns.group() == null ? -1 : column(header, columns.group(), file);
        List<String> groups = groupIndex < 0 ? null : new ArrayList<>();
        int weightIndex = columns.weight() == null ? -1 : column(header, columns.weight(), file);
        double[] weights = weightIndex < 0 ? null : new double[64];
        int[] rowNumbers = new int[64];
        int rowNumber = 0;

        List<String[]> texts = new ArrayList<>();
        List<String> labels = new ArrayList<>();
        int[] lines = new int[64];
        int dropped = 0;
        while ((line = nextRow(parser, start, fields)) >= 0) {
            rowNumber++;
            if (fields.size() != header.size()) {
                throw new PressmarkException("invalid-csv", file + ": line " + line + ": " + fields.size()
                        + " fields, but the header has " + header.size());
            }
            String label = labelIndex < 0 ? "" : fields.get(labelIndex).strip();
            String[] row = new String[textIndex.length];
            boolean anyText = false;
            for (int i = 0; i < textIndex.length; i++) {
                row[i] = fields.get(textIndex[i]);
                anyText |= !row[i].isBlank();
            }
            if (labelIndex >= 0 && (label.isEmpty() || !anyText)) {
                if (!dropIncomplete) {
                    throw new PressmarkException("incomplete-row", file + ": line " + line + ": "
                            + (label.isEmpty() ? "no label in column \"" + labelColumn + "\"" : "no text in " + quoted(textColumns))
                            + "; fix the row, or set data.drop_incomplete: true to leave such rows out");
                }
                dropped++;
                continue;
            }
            if (labels.size() == lines.length) {
                lines = Arrays.copyOf(lines, lines.length * 2);
                rowNumbers = Arrays.copyOf(rowNumbers, rowNumbers.length * 2);
                weights = weights == null ? null : Arrays.copyOf(weights, weights.length * 2);
            }
            if (weights != null) {
                weights[labels.size()] = weight(fields.get(weightIndex), columns.weight(), file, line);
            }
            lines[labels.size()] = line;
            rowNumbers[labels.size()] = rowNumber;
            if (groups != null) {
                groups.add(fields.get(groupIndex).strip());
            }
            texts.add(row);
            labels.add(label);
        }
        if (labels.isEmpty()) {
            throw new PressmarkException("empty-data", file + ": no complete data rows"
                    + (dropped > 0 ? " (" + dropped + " incomplete rows left out)" : ""));
        }
        return new LabelledData(textColumns, labelColumn, texts, labels, Arrays.copyOf(lines, labels.size()), sha256, dropped,
                groups, Arrays.copyOf(rowNumbers, labels.size()), weights == null ? null : Arrays.copyOf(weights, labels.size()));
    }

    /** A case weight: a finite decimal number {@code >= 0}; anything else is an error naming the line and value. */
    private static double weight(String field, String column, Path file, int line) {
        String value = field.strip();
        double weight;
        try {
            weight = Double.parseDouble(value);
        } catch (NumberFormatException e) {
            weight = Double.NaN;
        }
        // parseDouble also takes "NaN", "Infinity" and hex forms with a trailing type letter ("1d"):
        // only plain decimal numbers are case weights
        if (!(weight >= 0.0) || Double.isInfinite(weight) || !PLAIN_NUMBER.matcher(value).matches()) {
            throw new PressmarkException("invalid-weight", file + ": line " + line + ": case weight in column \"" + column
                    + "\" must be a finite number >= 0, was \"" + field + "\"");
        }
        return weight == 0.0 ? 0.0 : weight; // -0 weighs 0
    }

    /** A plain decimal number with an optional sign and exponent. */
    private static final java.util.regex.Pattern PLAIN_NUMBER =
            java.util.regex.Pattern.compile("[+-]?(\\d+\\.?\\d*|\\.\\d+)([eE][+-]?\\d+)?");

    /** Reads the next row into {@code fields}; returns the line it starts on, or -1 at the end. */
    private static int nextRow(JsonParser parser, FieldStart start, List<String> fields) throws IOException {
        start.after(parser);
        if (parser.nextToken() == null) {
            return -1;
        }
        fields.clear();
        int line = -1;
        JsonToken token;
        while ((token = start.after(parser).nextToken()) != JsonToken.END_ARRAY && token != null) {
            if (line < 0) {
                line = parser.currentTokenLocation().getLineNr();
            }
            fields.add(parser.getText());
        }
        return line >= 0 ? line : parser.currentLocation().getLineNr();
    }

    private static int column(List<String> header, String name, Path file) {
        int index = header.indexOf(name);
        if (index < 0) {
            throw new PressmarkException("unknown-column", file + ": line 1: no column \"" + name
                    + "\"; the header has " + quoted(header));
        }
        return index;
    }

    private static String quoted(List<String> names) {
        return "\"" + String.join("\", \"", names) + "\"";
    }

    /**
     * Where the field being read starts: the parser's position after the last token it returned,
     * past the separator that ends that token. The parser's own error locations say where it gave
     * up (the end of the file, for a quote never closed) or nothing at all (for a field past the
     * length limit); a person needs the line where the field began.
     */
    private static final class FieldStart {

        private final String text;
        private long offset;

        FieldStart(String text) {
            this.text = text;
        }

        /** Notes the position before the parser reads on; returns the parser. */
        JsonParser after(JsonParser parser) {
            offset = parser.currentLocation().getCharOffset();
            return parser;
        }

        /** The 1-based line of the first character of the field that follows the noted position. */
        int line() {
            int at = (int) Math.max(0, Math.min(offset, text.length()));
            if (at < text.length() && text.charAt(at) == ',') {
                at++;
            } else {
                while (at < text.length() && (text.charAt(at) == '\r' || text.charAt(at) == '\n')) {
                    at++;
                }
            }
            int line = 1;
            for (int i = 0; i < at; i++) {
                line += text.charAt(i) == '\n' ? 1 : 0;
            }
            return line;
        }
    }
}
