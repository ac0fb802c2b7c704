package dev.pressmark.core.bundle;

import dev.pressmark.core.search.SearchSummary;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;

/**
 * The report's section on a model search: the candidates' table (settings, cross-validated mean
 * ± standard error, the chosen one marked) and, when C was searched, the metric against C on a
 * log scale, one line with error bars for each combination of the other settings.
 */
final class SearchReport {

    static final String C_KEY = "classifier.c";
    private static final String[] COLOURS = {"#3d5a80", "#a04a2c", "#2f6f5e", "#8a5a9e", "#b08900", "#5b6472"};
    private static final int WIDTH = 520;
    private static final int HEIGHT = 260;
    private static final int LEFT = 60;
    private static final int TOP = 16;
    private static final int BOTTOM = 40;

    private SearchReport() {
    }

    static void append(StringBuilder html, SearchSummary search) {
        html.append("<h2>Model search</h2>\n<p class=\"sub\">").append(search.candidates().size())
                .append(" candidates scored by cross-validation on the training part; metric ")
                .append(HtmlReport.escape(search.metric().key())).append(", pick ").append(HtmlReport.escape(search.pick().key()))
                .append("; the chosen one (✓) was trained on the whole training part and tested once.</p>\n");
        table(html, search);
        if (search.keys().contains(C_KEY)) {
            plot(html, search);
        }
    }

    private static void table(StringBuilder html, SearchSummary search) {
        html.append("<table class=\"metrics search\"><thead><tr><th>#</th>");
        for (String key : search.keys()) {
            html.append("<th>").append(HtmlReport.escape(key)).append("</th>");
        }
        html.append("<th>").append(HtmlReport.escape(search.metric().key())).append(" (mean ± s.e.)</th></tr></thead><tbody>\n");
        for (int i = 0; i < search.candidates().size(); i++) {
            SearchSummary.Scored candidate = search.candidates().get(i);
            html.append(i == search.chosen() ? "<tr class=\"chosen\"><td>✓ " : "<tr><td>").append(i + 1).append("</td>");
            for (String key : search.keys()) {
                html.append("<td>").append(HtmlReport.escape(SearchSummary.show(candidate.settings().get(key)))).append("</td>");
            }
            html.append(String.format(Locale.ROOT, "<td>%.4f ± %.4f</td></tr>%n", candidate.mean(), candidate.standardError()));
        }
        html.append("</tbody></table>\n");
    }

    /** The metric against log C, one series per combination of the other grid settings. */
    private static void plot(StringBuilder html, SearchSummary search) {
        Map<String, List<Integer>> series = new LinkedHashMap<>();
        double minC = Double.POSITIVE_INFINITY;
        double maxC = Double.NEGATIVE_INFINITY;
        double low = Double.POSITIVE_INFINITY;
        double high = Double.NEGATIVE_INFINITY;
        for (int i = 0; i < search.candidates().size(); i++) {
            SearchSummary.Scored candidate = search.candidates().get(i);
            List<String> others = new ArrayList<>();
            candidate.settings().forEach((key, value) -> {
                if (!key.equals(C_KEY)) {
                    others.add(key + "=" + SearchSummary.show(value));
                }
            });
            series.computeIfAbsent(String.join(", ", others), k -> new ArrayList<>()).add(i);
            double c = candidate.settings().get(C_KEY).asDouble();
            minC = Math.min(minC, c);
            maxC = Math.max(maxC, c);
            low = Math.min(low, candidate.mean() - candidate.standardError());
            high = Math.max(high, candidate.mean() + candidate.standardError());
        }
        if (!(minC > 0)) {
            return;
        }
        double logMin = Math.log10(minC);
        double logSpan = Math.max(1e-9, Math.log10(maxC) - logMin);
        double span = Math.max(1e-9, high - low);
        int legend = series.size() > 1 ? 18 * series.size() : 0;
        html.append("<h3>").append(HtmlReport.escape(search.metric().key())).append(" against C</h3>\n");
        html.append(String.format(Locale.ROOT, "<svg class=\"chart\" role=\"img\" aria-label=\"%s against C\" width=\"%d\" height=\"%d\" "
                + "viewBox=\"0 0 %d %d\">%n", HtmlReport.escape(search.metric().key()), WIDTH, HEIGHT + legend, WIDTH, HEIGHT + legend));
        int plotWidth = WIDTH - LEFT - 20;
        int plotHeight = HEIGHT - TOP - BOTTOM;
        for (int tick = 0; tick <= 4; tick++) {
            double value = low + span * tick / 4.0;
            double y = TOP + plotHeight * (1 - tick / 4.0);
            html.append(String.format(Locale.ROOT, "<line x1=\"%d\" y1=\"%.1f\" x2=\"%d\" y2=\"%.1f\" class=\"grid\"/>"
                    + "<text x=\"%d\" y=\"%.1f\" class=\"axis\" text-anchor=\"end\">%.3f</text>%n", LEFT, y, LEFT + plotWidth, y, LEFT - 6, y + 4, value));
        }
        List<Double> cs = new ArrayList<>();
        for (SearchSummary.Scored candidate : search.candidates()) {
            double c = candidate.settings().get(C_KEY).asDouble();
            if (!cs.contains(c)) {
                cs.add(c);
                double x = LEFT + plotWidth * (Math.log10(c) - logMin) / logSpan;
                html.append(String.format(Locale.ROOT, "<text x=\"%.1f\" y=\"%d\" class=\"axis\" text-anchor=\"middle\">%s</text>%n",
                        x, TOP + plotHeight + 16, HtmlReport.escape(SearchSummary.show(candidate.settings().get(C_KEY)))));
            }
        }
        html.append(String.format(Locale.ROOT, "<text x=\"%d\" y=\"%d\" class=\"axis\" text-anchor=\"middle\">C (log scale)</text>%n",
                LEFT + plotWidth / 2, TOP + plotHeight + 32));
        int s = 0;
        for (Map.Entry<String, List<Integer>> entry : series.entrySet()) {
            String colour = COLOURS[s % COLOURS.length];
            List<Integer> members = new ArrayList<>(entry.getValue());
            members.sort((a, b) -> Double.compare(search.candidates().get(a).settings().get(C_KEY).asDouble(),
                    search.candidates().get(b).settings().get(C_KEY).asDouble()));
            StringBuilder points = new StringBuilder();
            for (int i : members) {
                SearchSummary.Scored candidate = search.candidates().get(i);
                double x = LEFT + plotWidth * (Math.log10(candidate.settings().get(C_KEY).asDouble()) - logMin) / logSpan;
                double y = TOP + plotHeight * (1 - (candidate.mean() - low) / span);
                double yLow = TOP + plotHeight * (1 - (candidate.mean() - candidate.standardError() - low) / span);
                double yHigh = TOP + plotHeight * (1 - (candidate.mean() + candidate.standardError() - low) / span);
                points.append(String.format(Locale.ROOT, "%.1f,%.1f ", x, y));
                html.append(String.format(Locale.ROOT, "<line x1=\"%.1f\" y1=\"%.1f\" x2=\"%.1f\" y2=\"%.1f\" stroke=\"%s\"/>"
                        + "<circle cx=\"%.1f\" cy=\"%.1f\" r=\"%s\" fill=\"%s\"/>%n", x, yLow, x, yHigh, colour, x, y,
                        i == search.chosen() ? "6" : "3.5", colour));
            }
            html.append(String.format(Locale.ROOT, "<polyline points=\"%s\" fill=\"none\" stroke=\"%s\" stroke-width=\"1.5\"/>%n",
                    points.toString().strip(), colour));
            if (series.size() > 1) {
                int y = HEIGHT + 18 * s + 4;
                html.append(String.format(Locale.ROOT, "<rect x=\"%d\" y=\"%d\" width=\"12\" height=\"12\" fill=\"%s\"/>"
                        + "<text x=\"%d\" y=\"%d\" class=\"axis\">%s</text>%n", LEFT, y, colour, LEFT + 18, y + 10,
                        HtmlReport.escape(entry.getKey())));
            }
            s++;
        }
        html.append("</svg>\n<p class=\"bar-title\">Each point is a candidate's cross-validated mean, its bar ± one standard"
                + " error; the larger point is the chosen one.</p>\n");
    }
}
