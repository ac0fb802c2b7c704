package dev.pressmark.cli;

import java.util.ArrayList;
import java.util.List;

/**
 * A bounded run of input rows, in input order: every column of each row, and the rows cut down to
 * a model's input fields, in the model's order.
 *
 * @param index the chunk's place in the input, from 0
 * @param rows every column of each row, in the input's column order
 * @param inputs per row, the text of each input field of the model
 */
record RowChunk(long index, List<String[]> rows, List<String[]> inputs) {

    RowChunk {
        rows = List.copyOf(rows);
        inputs = List.copyOf(inputs);
        if (rows.size() != inputs.size() || rows.isEmpty()) {
            throw new IllegalArgumentException("rows and inputs must have one entry per row and at least one row, had "
                    + rows.size() + " and " + inputs.size());
        }
    }

    int size() {
        return rows.size();
    }

    /** Rows whose input fields sit at {@code inputColumns} among their columns. */
    static RowChunk of(long index, List<String[]> rows, int[] inputColumns) {
        List<String[]> inputs = new ArrayList<>(rows.size());
        for (String[] row : rows) {
            String[] input = new String[inputColumns.length];
            for (int c = 0; c < input.length; c++) {
                input[c] = row[inputColumns[c]];
            }
            inputs.add(input);
        }
        return new RowChunk(index, rows, inputs);
    }
}
