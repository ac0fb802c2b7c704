package dev.pressmark.core.evaluate;

import java.util.Arrays;
import java.util.Objects;

/**
 * The groups of a labelled data set, compacted: group j is the j-th smallest distinct id, and each
 * group holds its row count and its rows per class (the classes it has, ascending). Built from the
 * multiset of (group id, label) pairs alone, so that row order cannot change anything computed
 * from it.
 */
final class GroupTable {

    final int classCount;
    final int rowCount;
    /** The caller's id of each compact group, ascending. */
    final int[] ids;
    /** The compact group of each row. */
    final int[] groupOfRow;
    final int[] size;
    /** Group g's classes are {@code classOf[start[g] .. start[g+1])}, with {@code rowsOf} rows each. */
    final int[] start;
    final int[] classOf;
    final int[] rowsOf;
    /** Rows per class, and groups per class. */
    final int[] classRows;
    final int[] classGroups;

    private GroupTable(int classCount, int[] ids, int[] groupOfRow, int[] size, int[] start, int[] classOf,
            int[] rowsOf, int[] classRows, int[] classGroups) {
        this.classCount = classCount;
        this.rowCount = groupOfRow.length;
        this.ids = ids;
        this.groupOfRow = groupOfRow;
        this.size = size;
        this.start = start;
        this.classOf = classOf;
        this.rowsOf = rowsOf;
        this.classRows = classRows;
        this.classGroups = classGroups;
    }

    static GroupTable of(int[] labels, int[] groups, int classCount) {
        int[] classRows = RowIndices.classCounts(labels, classCount);
        Objects.requireNonNull(groups, "groups");
        if (groups.length != labels.length) {
            throw new IllegalArgumentException("groups must hold one group id per row, " + labels.length
                    + ", had " + groups.length);
        }
        int[] ids = distinct(groups);
        int groupCount = ids.length;
        int[] groupOfRow = new int[labels.length];
        int[] size = new int[groupCount];
        for (int row = 0; row < labels.length; row++) {
            int g = Arrays.binarySearch(ids, groups[row]);
            groupOfRow[row] = g;
            size[g]++;
        }
        // Rows grouped by group (a counting sort), then each group's classes counted and sorted.
        int[] rowStart = new int[groupCount + 1];
        for (int g = 0; g < groupCount; g++) {
            rowStart[g + 1] = rowStart[g] + size[g];
        }
        int[] next = Arrays.copyOf(rowStart, groupCount);
        int[] byGroup = new int[labels.length];
        for (int row = 0; row < labels.length; row++) {
            byGroup[next[groupOfRow[row]]++] = labels[row];
        }
        int[] start = new int[groupCount + 1];
        int[] classOf = new int[labels.length];
        int[] rowsOf = new int[labels.length];
        int[] scratch = new int[classCount];
        int[] classGroups = new int[classCount];
        int entries = 0;
        for (int g = 0; g < groupCount; g++) {
            int first = entries;
            for (int i = rowStart[g]; i < rowStart[g + 1]; i++) {
                int k = byGroup[i];
                if (scratch[k]++ == 0) {
                    classOf[entries++] = k;
                }
            }
            Arrays.sort(classOf, first, entries);
            for (int e = first; e < entries; e++) {
                rowsOf[e] = scratch[classOf[e]];
                scratch[classOf[e]] = 0;
                classGroups[classOf[e]]++;
            }
            start[g + 1] = entries;
        }
        return new GroupTable(classCount, ids, groupOfRow, size, start, Arrays.copyOf(classOf, entries),
                Arrays.copyOf(rowsOf, entries), classRows, classGroups);
    }

    int groupCount() {
        return ids.length;
    }

    /**
     * K·Σ_k c_k² − s² for group g (s its rows, c_k its rows of class k): K² times the variance of
     * its class-count vector over all K classes, the key scikit-learn's StratifiedGroupKFold orders
     * groups by (as a standard deviation), here as an exact integer.
     */
    long spreadKey(int g) {
        long squares = 0;
        for (int e = start[g]; e < start[g + 1]; e++) {
            squares += (long) rowsOf[e] * rowsOf[e];
        }
        return classCount * squares - (long) size[g] * size[g];
    }

    private static int[] distinct(int[] values) {
        int[] sorted = values.clone();
        Arrays.sort(sorted);
        int n = 0;
        for (int i = 0; i < sorted.length; i++) {
            if (n == 0 || sorted[i] != sorted[n - 1]) {
                sorted[n++] = sorted[i];
            }
        }
        return Arrays.copyOf(sorted, n);
    }
}
