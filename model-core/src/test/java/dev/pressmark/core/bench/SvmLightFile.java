package dev.pressmark.core.bench;

import dev.pressmark.core.feature.SparseMatrix;
import java.io.BufferedReader;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;

/**
 * Reads the svmlight / libsvm sparse text format into a {@link SparseMatrix}, for benchmarks that
 * share one matrix with a reference written elsewhere (scikit-learn's
 * {@code sklearn.datasets.dump_svmlight_file}).
 *
 * <p>The format, as LIBLINEAR's README ("Installation and Data Format") and SVMlight's
 * documentation give it: one row per line, {@code <target> <index>:<value> <index>:<value> ...},
 * indices from 1 and ascending; an optional {@code qid:<n>} after the target (skipped); everything
 * from {@code #} to the end of a line is a comment, and a line holding only a comment is no row.
 * Column {@code index} of the file is column {@code index - 1} of the matrix.
 */
final class SvmLightFile {

    /**
     * The rows of a file.
     *
     * @param x the features, one matrix row per file row
     * @param targets the target of each row, as written
     */
    record Problem(SparseMatrix x, double[] targets) {

        /**
         * The targets of a two-class problem as class indices: 1 for the larger of the two values
         * (+1 in a file of -1 and +1), 0 for the smaller.
         */
        int[] binaryLabels() {
            double[] distinct = Arrays.stream(targets).distinct().sorted().toArray();
            if (distinct.length != 2) {
                throw new IllegalArgumentException("a binary problem needs exactly two target values, found "
                        + distinct.length + ": " + Arrays.toString(Arrays.copyOf(distinct, Math.min(5, distinct.length))));
            }
            int[] labels = new int[targets.length];
            for (int i = 0; i < labels.length; i++) {
                labels[i] = targets[i] == distinct[1] ? 1 : 0;
            }
            return labels;
        }
    }

    private SvmLightFile() {
    }

    /**
     * Reads {@code file}; the matrix has {@code minColumns} columns, or as many as the largest
     * index if that is more. Errors name the file, the line and the field.
     */
    static Problem read(Path file, int minColumns) {
        List<int[]> columns = new ArrayList<>();
        List<double[]> values = new ArrayList<>();
        double[] targets = new double[1024];
        int maxIndex = 0; // columns the file uses: its largest index
        try (BufferedReader in = Files.newBufferedReader(file, StandardCharsets.UTF_8)) {
            String line;
            int lineNumber = 0;
            IntDoubleRow row = new IntDoubleRow();
            while ((line = in.readLine()) != null) {
                lineNumber++;
                int hash = line.indexOf('#');
                String content = (hash >= 0 ? line.substring(0, hash) : line).strip();
                if (content.isEmpty()) {
                    continue;
                }
                String[] fields = content.split("[ \t]+");
                if (columns.size() == targets.length) {
                    targets = Arrays.copyOf(targets, targets.length * 2);
                }
                targets[columns.size()] = number(fields[0], file, lineNumber, "the target");
                row.clear();
                for (int f = 1; f < fields.length; f++) {
                    if (f == 1 && fields[f].startsWith("qid:")) {
                        continue;
                    }
                    int colon = fields[f].indexOf(':');
                    if (colon <= 0) {
                        throw error(file, lineNumber, "field " + (f + 1) + " must be index:value, was \"" + fields[f] + "\"");
                    }
                    int index = index(fields[f].substring(0, colon), file, lineNumber, f + 1);
                    if (row.size > 0 && index <= row.lastIndex()) {
                        throw error(file, lineNumber, "field " + (f + 1) + ": indices must ascend, but " + (index + 1)
                                + " follows " + (row.lastIndex() + 1));
                    }
                    row.add(index, number(fields[f].substring(colon + 1), file, lineNumber, "field " + (f + 1) + "'s value"));
                    maxIndex = Math.max(maxIndex, index + 1);
                }
                columns.add(row.columns());
                values.add(row.values());
            }
        } catch (IOException e) {
            throw new UncheckedIOException(file + ": cannot read: " + e.getMessage(), e);
        }
        SparseMatrix.Builder builder = SparseMatrix.builder(Math.max(minColumns, maxIndex));
        for (int i = 0; i < columns.size(); i++) {
            builder.addRow(columns.get(i), values.get(i));
        }
        return new Problem(builder.build(), Arrays.copyOf(targets, columns.size()));
    }

    /** One value per line, as {@code numpy.savetxt} writes a vector. */
    static double[] readVector(Path file) {
        try {
            List<String> lines = Files.readAllLines(file, StandardCharsets.UTF_8);
            double[] out = new double[lines.size()];
            for (int i = 0; i < out.length; i++) {
                out[i] = number(lines.get(i).strip(), file, i + 1, "the value");
            }
            return out;
        } catch (IOException e) {
            throw new UncheckedIOException(file + ": cannot read: " + e.getMessage(), e);
        }
    }

    private static int index(String text, Path file, int line, int field) {
        int index;
        try {
            index = Integer.parseInt(text);
        } catch (NumberFormatException e) {
            throw error(file, line, "field " + field + ": the index must be an integer, was \"" + text + "\"");
        }
        if (index < 1) {
            throw error(file, line, "field " + field + ": indices start at 1, was " + index);
        }
        return index - 1;
    }

    private static double number(String text, Path file, int line, String what) {
        double value;
        try {
            value = Double.parseDouble(text);
        } catch (NumberFormatException e) {
            value = Double.NaN;
        }
        if (!Double.isFinite(value)) {
            throw error(file, line, what + " must be a finite number, was \"" + text + "\"");
        }
        return value;
    }

    private static IllegalArgumentException error(Path file, int line, String message) {
        return new IllegalArgumentException(file + ": line " + line + ": " + message);
    }

    /** A growing row of (column, value) pairs, reused from line to line. */
    private static final class IntDoubleRow {
        private int[] columns = new int[64];
        private double[] values = new double[64];
        private int size;

        void clear() {
            size = 0;
        }

        int lastIndex() {
            return columns[size - 1];
        }

        void add(int column, double value) {
            if (size == columns.length) {
                columns = Arrays.copyOf(columns, size * 2);
                values = Arrays.copyOf(values, size * 2);
            }
            columns[size] = column;
            values[size++] = value;
        }

        int[] columns() {
            return Arrays.copyOf(columns, size);
        }

        double[] values() {
            return Arrays.copyOf(values, size);
        }
    }
}
