package dev.pressmark.core.train;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.function.IntFunction;
import java.util.regex.Pattern;

/**
 * The group of every row, as ids for {@code Resampling}: rows with equal values of the group
 * column share an id, numbered in the order the values first appear; a row whose value is empty
 * is a group of its own (an empty cell says nothing about which rows belong together).
 */
final class RowGroups {

    private static final Pattern WHITE_SPACE = Pattern.compile("\\s+");

    private final int[] ids;
    private final int count;
    /** Names a group for messages; made on demand, since only a warning about a large group needs one. */
    private final IntFunction<String> namer;

    private RowGroups(int[] ids, int count, IntFunction<String> namer) {
        this.ids = ids;
        this.count = count;
        this.namer = namer;
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
        List<String> frozen = List.copyOf(names);
        return new RowGroups(ids, frozen.size(), frozen::get);
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
        Arrays.fill(firstOfText, -1);
        int[] firstOfGroup = new int[groups == null ? 0 : groups.count()];
        Arrays.fill(firstOfGroup, -1);
        for (int i = 0; i < rows; i++) {
            firstOfText[textIds[i]] = union(parent, firstOfText[textIds[i]], i);
            if (groups != null) {
                firstOfGroup[groups.ids[i]] = union(parent, firstOfGroup[groups.ids[i]], i);
            }
        }
        int[] ids = new int[rows];
        int[] idOfRoot = new int[rows];
        Arrays.fill(idOfRoot, -1);
        int[] firstRow = new int[rows];
        int count = 0;
        for (int i = 0; i < rows; i++) {
            int root = find(parent, i);
            if (idOfRoot[root] < 0) {
                firstRow[count] = i;
                idOfRoot[root] = count++;
            }
            ids[i] = idOfRoot[root];
        }
        return new RowGroups(ids, count, id -> groups != null ? groups.name(groups.ids[firstRow[id]])
                : "text: " + shortened(String.join(" | ", texts.get(firstRow[id]))));
    }

    /** Joins row {@code i} to the set of row {@code first} (none when -1); returns the set's first row. */
    private static int union(int[] parent, int first, int i) {
        if (first < 0) {
            return i;
        }
        int a = find(parent, first);
        int b = find(parent, i);
        if (a != b) {
            // the smaller index as root keeps roots stable; path halving in find keeps the trees shallow
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
        String line = WHITE_SPACE.matcher(text.strip()).replaceAll(" ");
        return line.length() <= 40 ? line : line.substring(0, 39) + "…";
    }

    /** Per row, its group's id. */
    int[] ids() {
        return ids;
    }

    int count() {
        return count;
    }

    /** The group column's value for group {@code id}, a description of an empty value's row, or a text. */
    String name(int id) {
        return namer.apply(id);
    }
}
