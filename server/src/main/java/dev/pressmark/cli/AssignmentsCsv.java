package dev.pressmark.cli;

import dev.pressmark.core.evaluate.RowAssignments;

/**
 * The {@code --assignments} file: one line per data row with {@code row} (its 1-based number among
 * the data file's rows, header excluded), {@code part} ({@code train} or {@code test}) and
 * {@code fold} (1..k in the first repeat, empty for a test row). Rows of a separate test file are
 * not listed: every row of the data file trains then.
 */
final class AssignmentsCsv {

    static final String HEADER = "row,part,fold\n";

    private AssignmentsCsv() {}

    /**
     * The file's text for the first {@code rowNumbers.length} rows of {@code foldOfRow}.
     *
     * @param rowNumbers per data row kept, its number in the file
     * @param foldOfRow per row of the run, its fold from 0 or {@link RowAssignments#TEST}; may run
     *     on past the data rows (into a test file's rows)
     */
    static String render(int[] rowNumbers, int[] foldOfRow) {
        StringBuilder csv = new StringBuilder(HEADER.length() + rowNumbers.length * 12).append(HEADER);
        for (int i = 0; i < rowNumbers.length; i++) {
            csv.append(rowNumbers[i]);
            if (foldOfRow[i] == RowAssignments.TEST) {
                csv.append(",test,\n");
            } else {
                csv.append(",train,").append(foldOfRow[i] + 1).append('\n');
            }
        }
        return csv.toString();
    }
}
