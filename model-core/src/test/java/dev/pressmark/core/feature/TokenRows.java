package dev.pressmark.core.feature;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import net.jqwik.api.Arbitraries;
import net.jqwik.api.Arbitrary;

/** Small generators and views of token rows for the feature tests. */
final class TokenRows {

    /** Two columns whose names sort differently from their feature names ("title2:" < "title:"). */
    static final List<String> TWO_COLUMNS = List.of("title", "title2");

    /** Few tokens, so that document frequencies tie often; some hold the ':' of feature names. */
    static final List<String> ALPHABET = List.of("a", "b", "c", "d", "e", "B", "##a", "##b", ":", "a:b", "é");

    private TokenRows() {
    }

    /** One row; each argument is a column's tokens separated by spaces ("" for no tokens). */
    static List<List<String>> row(String... columns) {
        List<List<String>> row = new ArrayList<>(columns.length);
        for (String column : columns) {
            row.add(column.isEmpty() ? List.of() : List.of(column.split(" ")));
        }
        return row;
    }

    /** One single-column row per line of a count matrix: term {@code t} repeated {@code counts[t]} times. */
    static List<List<List<String>>> fromCounts(int[][] counts) {
        List<List<List<String>>> rows = new ArrayList<>();
        for (int[] document : counts) {
            List<String> tokens = new ArrayList<>();
            for (int t = 0; t < document.length; t++) {
                for (int k = 0; k < document[t]; k++) {
                    tokens.add("t" + t);
                }
            }
            rows.add(List.of(tokens));
        }
        return rows;
    }

    /** Training sets of one to {@code maxRows} rows over {@link #TWO_COLUMNS} and {@link #ALPHABET}. */
    static Arbitrary<List<List<List<String>>>> rows(int maxRows, int maxTokensPerColumn) {
        Arbitrary<List<String>> column = Arbitraries.of(ALPHABET).list().ofMaxSize(maxTokensPerColumn);
        return column.list().ofSize(TWO_COLUMNS.size()).list().ofMinSize(1).ofMaxSize(maxRows);
    }

    /** Whether any row holds a token, which fitting needs. */
    static boolean hasTokens(List<List<List<String>>> rows) {
        for (List<List<String>> row : rows) {
            for (List<String> column : row) {
                if (!column.isEmpty()) {
                    return true;
                }
            }
        }
        return false;
    }

    /** Row {@code i} of {@code x} as a dense array. */
    static double[] dense(SparseMatrix x, int i) {
        double[] row = new double[x.columns()];
        for (int k = x.rowStart(i); k < x.rowEnd(i); k++) {
            row[x.column(k)] = x.value(k);
        }
        return row;
    }

    /** Column {@code j} of {@code x} as a dense array. */
    static double[] column(SparseMatrix x, int j) {
        double[] column = new double[x.rows()];
        for (int i = 0; i < x.rows(); i++) {
            column[i] = dense(x, i)[j];
        }
        return column;
    }

    /** The occurrences of {@code token} in the {@code c}-th column of every row. */
    static double[] counts(List<List<List<String>>> rows, int c, String token) {
        double[] counts = new double[rows.size()];
        for (int i = 0; i < rows.size(); i++) {
            for (String t : rows.get(i).get(c)) {
                counts[i] += t.equals(token) ? 1 : 0;
            }
        }
        return counts;
    }

    /** The number of tokens of every row over all its columns. */
    static double[] lengths(List<List<List<String>>> rows) {
        double[] lengths = new double[rows.size()];
        for (int i = 0; i < rows.size(); i++) {
            for (List<String> column : rows.get(i)) {
                lengths[i] += column.size();
            }
        }
        return lengths;
    }

    static double[] divide(double[] a, double[] b) {
        double[] out = Arrays.copyOf(a, a.length);
        for (int i = 0; i < a.length; i++) {
            out[i] = b[i] == 0 ? 0 : a[i] / b[i];
        }
        return out;
    }
}
