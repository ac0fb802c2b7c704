package dev.pressmark.core.feature;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import java.util.Arrays;
import java.util.SplittableRandom;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.constraints.IntRange;
import org.junit.jupiter.api.Test;

class SparseMatrixTest {

    /** Sums of a few products in a different order agree to a few ulps. */
    private static final double ROUNDING = 1e-12;

    @Test
    void stores_the_textbook_example_in_the_textbook_arrays() {
        // The 4 x 4 CSR example of the Wikipedia article "Sparse matrix" (from memory):
        // rows (0 0 0 0), (5 8 0 0), (0 0 3 0), (0 6 0 0) give V = [5 8 3 6],
        // COL_INDEX = [0 1 2 1], ROW_INDEX = [0 0 2 3 4].
        SparseMatrix m = SparseMatrix.builder(4)
                .addRow(new int[] {}, new double[] {})
                .addRow(new int[] {0, 1}, new double[] {5, 8})
                .addRow(new int[] {2}, new double[] {3})
                .addRow(new int[] {1}, new double[] {6})
                .build();

        int[] rowIndex = new int[m.rows() + 1];
        for (int i = 0; i < m.rows(); i++) {
            rowIndex[i] = m.rowStart(i);
            rowIndex[i + 1] = m.rowEnd(i);
        }
        int[] colIndex = new int[m.nonZeros()];
        double[] v = new double[m.nonZeros()];
        for (int k = 0; k < m.nonZeros(); k++) {
            colIndex[k] = m.column(k);
            v[k] = m.value(k);
        }
        assertThat(rowIndex).containsExactly(0, 0, 2, 3, 4);
        assertThat(colIndex).containsExactly(0, 1, 2, 1);
        assertThat(v).containsExactly(5, 8, 3, 6);
        assertThat(m.rows()).isEqualTo(4);
        assertThat(m.columns()).isEqualTo(4);
    }

    @Test
    void computes_dot_products_norms_and_scaled_additions_of_a_row() {
        SparseMatrix m = SparseMatrix.builder(4).addRow(new int[] {0, 3}, new double[] {2, -1}).build();
        double[] w = {1, 10, 100, 1000, 5};

        assertThat(m.dot(0, w)).isEqualTo(2 * 1 - 1000);
        assertThat(m.squaredNorm(0)).isEqualTo(5);
        m.addScaledRow(0, 0.5, w);
        assertThat(w).containsExactly(2, 10, 100, 999.5, 5);
    }

    @Test
    void refuses_columns_that_do_not_strictly_increase() {
        SparseMatrix.Builder builder = SparseMatrix.builder(10).addRow(new int[] {1}, new double[] {1});

        assertThatThrownBy(() -> builder.addRow(new int[] {2, 5, 5}, new double[] {1, 1, 1}))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessage("row 1: cols must be strictly increasing, but cols[2] = 5 follows cols[1] = 5");
        assertThatThrownBy(() -> builder.addRow(new int[] {3, 2}, new double[] {1, 1}))
                .hasMessageContaining("cols[1] = 2 follows cols[0] = 3");
        assertThat(builder.rows()).isEqualTo(1);
    }

    @Test
    void refuses_columns_outside_the_matrix() {
        SparseMatrix.Builder builder = SparseMatrix.builder(10);

        assertThatThrownBy(() -> builder.addRow(new int[] {3, 10}, new double[] {1, 1}))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessage("row 0: cols[1] must be in [0, 10), was 10");
        assertThatThrownBy(() -> builder.addRow(new int[] {-1}, new double[] {1}))
                .hasMessage("row 0: cols[0] must be in [0, 10), was -1");
    }

    @Test
    void refuses_mismatched_lengths_and_values_that_are_not_finite() {
        SparseMatrix.Builder builder = SparseMatrix.builder(10);

        assertThatThrownBy(() -> builder.addRow(new int[] {1, 2}, new double[] {1}))
                .hasMessage("row 0: cols has 2 entries but vals has 1");
        assertThatThrownBy(() -> builder.addRow(new int[] {1, 2}, new double[] {1, Double.NaN}))
                .hasMessage("row 0: vals[1] must be finite, was NaN");
        assertThatThrownBy(() -> SparseMatrix.builder(-1)).hasMessage("columns must be >= 0, was -1");
    }

    @Test
    void refuses_a_weight_vector_shorter_than_a_row_and_a_subset_index_out_of_range() {
        SparseMatrix m = SparseMatrix.builder(3).addRow(new int[] {2}, new double[] {1}).build();

        assertThatThrownBy(() -> m.dot(0, new double[2]))
                .hasMessage("w must have at least 3 entries (one per column), had 2");
        assertThatThrownBy(() -> m.rowSubset(new int[] {0, 1}))
                .hasMessage("rows[1] must be in [0, 1), was 1");
        assertThatThrownBy(() -> m.rowStart(1)).isInstanceOf(IndexOutOfBoundsException.class);
    }

    @Test
    void does_not_change_when_the_arrays_it_was_built_from_change() {
        int[] cols = {0, 1};
        double[] vals = {1, 2};
        SparseMatrix.Builder builder = SparseMatrix.builder(2).addRow(cols, vals);
        SparseMatrix m = builder.build();
        cols[1] = 0;
        vals[0] = 99;
        builder.addRow(new int[] {1}, new double[] {7});

        assertThat(m.rows()).isEqualTo(1);
        assertThat(m.value(0)).isEqualTo(1);
        assertThat(m.column(1)).isEqualTo(1);
        assertThat(builder.build().rows()).isEqualTo(2);
    }

    @Property(tries = 200)
    void a_dot_product_equals_the_dense_one(@ForAll long seed, @ForAll @IntRange(min = 1, max = 40) int columns) {
        SplittableRandom random = new SplittableRandom(seed);
        double[][] dense = randomDense(random, 5, columns);
        SparseMatrix m = fromDense(dense);
        double[] w = new double[columns + 1];
        for (int j = 0; j < w.length; j++) {
            w[j] = random.nextDouble(-1, 1);
        }

        for (int i = 0; i < dense.length; i++) {
            double expected = 0.0;
            double norm = 0.0;
            for (int j = 0; j < columns; j++) {
                expected += dense[i][j] * w[j];
                norm += dense[i][j] * dense[i][j];
            }
            assertThat(m.dot(i, w)).isCloseTo(expected, within(ROUNDING));
            assertThat(m.squaredNorm(i)).isCloseTo(norm, within(ROUNDING));
        }
    }

    @Property(tries = 200)
    void a_row_subset_holds_exactly_the_chosen_rows_in_the_chosen_order(@ForAll long seed,
            @ForAll @IntRange(min = 1, max = 12) int rows, @ForAll @IntRange(min = 0, max = 20) int picks) {
        SplittableRandom random = new SplittableRandom(seed);
        double[][] dense = randomDense(random, rows, 8);
        SparseMatrix m = fromDense(dense);
        int[] chosen = new int[picks];
        for (int p = 0; p < picks; p++) {
            chosen[p] = random.nextInt(rows);
        }

        SparseMatrix subset = m.rowSubset(chosen);

        assertThat(subset.rows()).isEqualTo(picks);
        assertThat(subset.columns()).isEqualTo(m.columns());
        for (int p = 0; p < picks; p++) {
            assertThat(toDense(subset, p)).containsExactly(dense[chosen[p]]);
        }
    }

    private static double[][] randomDense(SplittableRandom random, int rows, int columns) {
        double[][] dense = new double[rows][columns];
        for (double[] row : dense) {
            for (int j = 0; j < columns; j++) {
                row[j] = random.nextInt(3) == 0 ? random.nextDouble(-2, 2) : 0.0;
            }
        }
        return dense;
    }

    private static SparseMatrix fromDense(double[][] dense) {
        SparseMatrix.Builder builder = SparseMatrix.builder(dense[0].length);
        for (double[] row : dense) {
            int n = 0;
            int[] cols = new int[row.length];
            double[] vals = new double[row.length];
            for (int j = 0; j < row.length; j++) {
                if (row[j] != 0.0) {
                    cols[n] = j;
                    vals[n++] = row[j];
                }
            }
            builder.addRow(Arrays.copyOf(cols, n), Arrays.copyOf(vals, n));
        }
        return builder.build();
    }

    private static double[] toDense(SparseMatrix m, int row) {
        double[] dense = new double[m.columns()];
        for (int k = m.rowStart(row); k < m.rowEnd(row); k++) {
            dense[m.column(k)] = m.value(k);
        }
        return dense;
    }
}
