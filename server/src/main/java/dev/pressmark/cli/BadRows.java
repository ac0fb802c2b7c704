package dev.pressmark.cli;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;

/** Counts the rows left out as bad and keeps the lines of the first few, for the closing report. */
final class BadRows {

    /** How many lines the report names. */
    static final int LINES_NAMED = 10;

    private long count;
    private final List<Long> firstLines = new ArrayList<>();

    void add(long line) {
        count++;
        if (firstLines.size() < LINES_NAMED) {
            firstLines.add(line);
        }
    }

    long count() {
        return count;
    }

    /** One line for stderr, such as {@code 2 bad rows left out (lines 3, 9)}; empty when there were none. */
    String report() {
        if (count == 0) {
            return "";
        }
        StringBuilder lines = new StringBuilder();
        for (Long line : firstLines) {
            lines.append(lines.length() == 0 ? "" : ", ").append(line);
        }
        return String.format(Locale.ROOT, "%,d bad %s left out (%s %s%s)", count, count == 1 ? "row" : "rows",
                firstLines.size() == 1 ? "line" : "lines", lines, count > firstLines.size() ? ", ..." : "");
    }
}
