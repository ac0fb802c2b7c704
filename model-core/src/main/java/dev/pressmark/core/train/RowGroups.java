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
