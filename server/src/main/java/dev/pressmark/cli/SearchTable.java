package dev.pressmark.cli;

import dev.pressmark.core.search.SearchSummary;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;

/** A search's candidates as a text table: settings, CV mean ± standard error, the chosen one marked {@code *}. */
final class SearchTable {

    private SearchTable() {
    }

    static String render(SearchSummary search) {
        List<String> keys = search.keys();
        List<String> header = new ArrayList<>(keys);
        header.add(search.metric().key() + " (cv mean ± s.e.)");
        List<List<String>> rows = new ArrayList<>();
        for (SearchSummary.Scored candidate : search.candidates()) {
            List<String> row = new ArrayList<>();
            for (String key : keys) {
                row.add(SearchSummary.show(candidate.settings().get(key)));
            }
            row.add(String.format(Locale.ROOT, "%.4f ± %.4f", candidate.mean(), candidate.standardError()));
            rows.add(row);
        }
        int[] widths = new int[header.size()];
        for (int k = 0; k < widths.length; k++) {
            widths[k] = header.get(k).length();
            for (List<String> row : rows) {
                widths[k] = Math.max(widths[k], row.get(k).length());
            }
        }
        StringBuilder out = new StringBuilder();
        out.append(String.format(Locale.ROOT, "search: %d candidates, metric %s, pick %s%n", rows.size(), search.metric().key(),
                search.pick().key()));
        line(out, "  ", "#", header, widths, rows.size());
        for (int i = 0; i < rows.size(); i++) {
            line(out, i == search.chosen() ? "* " : "  ", Integer.toString(i + 1), rows.get(i), widths, rows.size());
        }
        return out.toString();
    }

    private static void line(StringBuilder out, String mark, String number, List<String> cells, int[] widths, int count) {
        out.append(mark).append(String.format(Locale.ROOT, "%" + Integer.toString(count).length() + "s", number));
        for (int k = 0; k < cells.size(); k++) {
            out.append("  ").append(String.format(Locale.ROOT, "%-" + widths[k] + "s", cells.get(k)));
        }
        int end = out.length();
        while (end > 0 && out.charAt(end - 1) == ' ') {
            end--;
        }
        out.setLength(end);
        out.append(System.lineSeparator());
    }
}
