package dev.pressmark.core.train;

import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;

/**
 * The group of every row, as ids for {@code Resampling}: rows with equal values of the group
 * column share an id, numbered in the order the values first appear; a row whose value is empty
 * is a group of its own (an empty cell says nothing about which rows belong together).
 */
final class RowGroups {

    private final int[] ids;
    private final List<String> names;

    private RowGroups(int[] ids, List<String> names) {
        this.ids = ids;
        this.names = names;
    }

    /** The groups of {@code values}, one per row; {@code rowNumbers} name the rows whose value is empty. */
    static RowGroups of(List<String> values, int[] rowNumbers) {
        int[] ids = new int[values.size()];
        List<String> names = new ArrayList<>();
        Map<String, Integer> known = new HashMap<>();
        for (int i = 0; i < ids.length; i++) {
            String value = values.get(i);
            if (value.isEmpty()) {
                ids[i] = names.size();
                names.add("(empty value, data row " + rowNumbers[i] + ")");
                continue;
            }
            Integer id = known.get(value);
            if (id == null) {
                id = names.size();
                known.put(value, id);
                names.add(value);
            }
            ids[i] = id;
        }
        return new RowGroups(ids, List.copyOf(names));
    }

    /**
     * Groups in which rows that share a group of {@code groups} (null for none) or a text id of
     * {@code textIds} are together: the connected components of both relations (union-find). A
     * group is named by its first row's group value, or, without {@code groups}, by its first
     * row's text.
     *
     * @param texts per row, its texts, for the names
     */
    static RowGroups joined(RowGroups groups, int[] textIds, List<String[]> texts) {
        int rows = textIds.length;
        int[] parent = new int[rows];
        for (int i = 0; i < rows; i++) {
            parent[i] = i;
        }
        int[] firstOfText = new int[TextKeys.count(textIds)];
        java.util.Arrays.fill(firstOfText, -1);
        int[] firstOfGroup = new int[groups == null ? 0 : groups.count()];
        java.util.Arrays.fill(firstOfGroup, -1);
        for (int i = 0; i < rows; i++) {
            firstOfText[textIds[i]] = union(parent, firstOfText[textIds[i]], i);
            if (groups != null) {
                firstOfGroup[groups.ids[i]] = union(parent, firstOfGroup[groups.ids[i]], i);
            }
        }
        int[] ids = new int[rows];
        int[] idOfRoot = new int[rows];
        java.util.Arrays.fill(idOfRoot, -1);
        List<String> names = new ArrayList<>();
        for (int i = 0; i < rows; i++) {
            int root = find(parent, i);
            if (idOfRoot[root] < 0) {
                idOfRoot[root] = names.size();
                names.add(groups != null ? groups.name(groups.ids[i]) : "text: " + shortened(String.join(" | ", texts.get(i))));
            }
            ids[i] = idOfRoot[root];
        }
        return new RowGroups(ids, List.copyOf(names));
    }

    /** Joins row {@code i} to the set of row {@code first} (none when -1); returns the set's first row. */
    private static int union(int[] parent, int first, int i) {
        if (first < 0) {
            return i;
        }
        int a = find(parent, first);
        int b = find(parent, i);
        if (a != b) {
            // the smaller index as root keeps roots stable and the trees shallow enough with path halving
            parent[Math.max(a, b)] = Math.min(a, b);
        }
        return first;
    }

    private static int find(int[] parent, int i) {
        while (parent[i] != i) {
            parent[i] = parent[parent[i]];
            i = parent[i];
        }
        return i;
    }

    private static String shortened(String text) {
        String line = text.strip().replaceAll("\\s+", " ");
        return line.length() <= 40 ? line : line.substring(0, 39) + "…";
    }

    /** Per row, its group's id. */
    int[] ids() {
        return ids;
    }

    int count() {
        return names.size();
    }

    /** The group column's value for group {@code id}, or a description of an empty value's row. */
    String name(int id) {
        return names.get(id);
    }
}
