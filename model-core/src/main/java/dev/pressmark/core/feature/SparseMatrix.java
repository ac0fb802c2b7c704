package dev.pressmark.core.feature;

import java.util.Arrays;
import java.util.Objects;

/**
 * An immutable sparse matrix of doubles in compressed sparse row (CSR) form: the entries of row
 * {@code i} sit at positions {@code rowStart(i) .. rowEnd(i) - 1}, each with its {@link #column(int)}
 * and {@link #value(int)}, columns strictly increasing within a row.
 *
 * <p>The position accessors read the backing arrays directly and copy nothing, so that solvers in
 * other packages can walk rows in their inner loops at array speed. Build one with
 * {@link #builder(int)}.
 */
public final class SparseMatrix {

    private final int rows;
    private final int columns;
    private final int[] rowStart;
    private final int[] columnIndex;
    private final double[] values;

    private SparseMatrix(int rows, int columns, int[] rowStart, int[] columnIndex, double[] values) {
        this.rows = rows;
        this.columns = columns;
        this.rowStart = rowStart;
        this.columnIndex = columnIndex;
        this.values = values;
    }

    /** A builder for a matrix of {@code columns} columns; rows are added one by one. */
    public static Builder builder(int columns) {
        return new Builder(columns);
    }

    public int rows() {
        return rows;
    }

    public int columns() {
        return columns;
    }

    /** The number of stored entries. */
    public int nonZeros() {
        return rowStart[rows];
    }

    /** The position of the first entry of {@code row}. */
    public int rowStart(int row) {
        return rowStart[Objects.checkIndex(row, rows)];
    }

    /** One past the position of the last entry of {@code row}. */
    public int rowEnd(int row) {
        return rowStart[Objects.checkIndex(row, rows) + 1];
    }

    /** The column of the entry at {@code position}, in {@code [0, nonZeros())}. */
    public int column(int position) {
        return columnIndex[position];
    }

    /** The value of the entry at {@code position}, in {@code [0, nonZeros())}. */
    public double value(int position) {
        return values[position];
    }

    /**
     * The dot product of {@code row} with a dense vector. {@code w} may be longer than
     * {@link #columns()}: the extra entries are ignored, which lets a weight vector carry a bias
     * weight after the features.
     */
    public double dot(int row, double[] w) {
        requireLength(w);
        double sum = 0.0;
        for (int k = rowStart(row), end = rowStart[row + 1]; k < end; k++) {
            sum += values[k] * w[columnIndex[k]];
        }
        return sum;
    }

    /** {@code w += scale * row}, on the first {@link #columns()} entries of {@code w}. */
    public void addScaledRow(int row, double scale, double[] w) {
        requireLength(w);
        for (int k = rowStart(row), end = rowStart[row + 1]; k < end; k++) {
            w[columnIndex[k]] += scale * values[k];
        }
    }

    /** The squared Euclidean norm of {@code row}. */
    public double squaredNorm(int row) {
        double sum = 0.0;
        for (int k = rowStart(row), end = rowStart[row + 1]; k < end; k++) {
            sum += values[k] * values[k];
        }
        return sum;
    }

    /**
     * A new matrix whose row {@code i} is this matrix's row {@code rows[i]}. Indices may repeat
     * (as in a bootstrap sample) and come in any order.
     */
    public SparseMatrix rowSubset(int[] rows) {
        Objects.requireNonNull(rows, "rows");
        int[] start = new int[rows.length + 1];
        for (int i = 0; i < rows.length; i++) {
            int row = rows[i];
            if (row < 0 || row >= this.rows) {
                throw new IllegalArgumentException(
                        "rows[" + i + "] must be in [0, " + this.rows + "), was " + row);
            }
            start[i + 1] = start[i] + rowStart[row + 1] - rowStart[row];
        }
        int[] newColumns = new int[start[rows.length]];
        double[] newValues = new double[start[rows.length]];
        for (int i = 0; i < rows.length; i++) {
            int from = rowStart[rows[i]];
            int length = start[i + 1] - start[i];
            System.arraycopy(columnIndex, from, newColumns, start[i], length);
            System.arraycopy(values, from, newValues, start[i], length);
        }
        return new SparseMatrix(rows.length, columns, start, newColumns, newValues);
    }

    private void requireLength(double[] w) {
        if (w.length < columns) {
            throw new IllegalArgumentException(
                    "w must have at least " + columns + " entries (one per column), had " + w.length);
        }
    }

    @Override
    public String toString() {
        return "SparseMatrix[" + rows + " x " + columns + ", " + nonZeros() + " non-zeros]";
    }

    /**
     * Collects rows for a {@link SparseMatrix}. Each row's column indices must be strictly increasing
     * and inside {@code [0, columns)}, and its values finite; a row that breaks a rule is refused with
     * a message naming the row and the position. The builder copies what it is given and may go on
     * after {@link #build()}.
     */
    public static final class Builder {

        private final int columns;
        private int rows;
        private int[] rowStart = new int[16];
        private int[] columnIndex = new int[64];
        private double[] values = new double[64];

        private Builder(int columns) {
            if (columns < 0) {
                throw new IllegalArgumentException("columns must be >= 0, was " + columns);
            }
            this.columns = columns;
        }

        /** Appends a row of {@code cols.length} entries and returns this builder. */
        public Builder addRow(int[] cols, double[] vals) {
            Objects.requireNonNull(cols, "cols");
            Objects.requireNonNull(vals, "vals");
            if (cols.length != vals.length) {
                throw new IllegalArgumentException("row " + rows + ": cols has " + cols.length
                        + " entries but vals has " + vals.length);
            }
            for (int k = 0; k < cols.length; k++) {
                if (cols[k] < 0 || cols[k] >= columns) {
                    throw new IllegalArgumentException("row " + rows + ": cols[" + k + "] must be in [0, "
                            + columns + "), was " + cols[k]);
                }
                if (k > 0 && cols[k] <= cols[k - 1]) {
                    throw new IllegalArgumentException("row " + rows + ": cols must be strictly increasing, but cols["
                            + k + "] = " + cols[k] + " follows cols[" + (k - 1) + "] = " + cols[k - 1]);
                }
                if (!Double.isFinite(vals[k])) {
                    throw new IllegalArgumentException("row " + rows + ": vals[" + k + "] must be finite, was "
                            + vals[k]);
                }
            }
            int used = rowStart[rows];
            int needed = used + cols.length;
            if (needed > columnIndex.length) {
                int capacity = Math.max(needed, columnIndex.length * 2);
                columnIndex = Arrays.copyOf(columnIndex, capacity);
                values = Arrays.copyOf(values, capacity);
            }
            if (rows + 2 > rowStart.length) {
                rowStart = Arrays.copyOf(rowStart, rowStart.length * 2);
            }
            System.arraycopy(cols, 0, columnIndex, used, cols.length);
            System.arraycopy(vals, 0, values, used, vals.length);
            rows++;
            rowStart[rows] = needed;
            return this;
        }

        /** The number of rows added so far. */
        public int rows() {
            return rows;
        }

        /** The matrix of the rows added so far. */
        public SparseMatrix build() {
            int nonZeros = rowStart[rows];
            return new SparseMatrix(rows, columns, Arrays.copyOf(rowStart, rows + 1),
                    Arrays.copyOf(columnIndex, nonZeros), Arrays.copyOf(values, nonZeros));
        }
    }
}
