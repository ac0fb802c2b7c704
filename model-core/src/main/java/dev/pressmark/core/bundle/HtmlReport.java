package dev.pressmark.core.bundle;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import dev.pressmark.core.classify.LinearWeights;
import dev.pressmark.core.evaluate.DuplicateCounts;
import dev.pressmark.core.feature.FeatureSpace;
import com.fasterxml.jackson.databind.node.MissingNode;
import java.util.ArrayList;
import java.util.Collections;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Optional;

/**
 * The HTML report of a bundle: one self-contained page (inline CSS and SVG, no script, nothing
 * fetched) with the metrics, the confusion matrix as a heat map, the most positive and most
 * negative features of each class, the per-fold spread of each metric, and the config and
 * provenance. Everything comes from the bundle, so the report can be made again from it.
 */
public final class HtmlReport {

    private static final String SVG_NAMESPACE = "http://www.w3.org/2000/svg";

    /** How many features per sign and class the bars show. */
    public static final int TOP_FEATURES = 20;

    private static final ObjectMapper PRETTY = new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT);

    private HtmlReport() {
    }

    public static String render(Bundle bundle) {
        Manifest manifest = bundle.typedManifest();
        Optional<Manifest.Training> training = manifest.training();
        Optional<Manifest.Metrics> metrics = manifest.metrics();
        StringBuilder html = new StringBuilder(32_768);
        html.append("<!DOCTYPE html>\n<html lang=\"en\"><head><meta charset=\"utf-8\">\n<title>")
                .append(escape(bundle.name())).append(" — model report</title>\n<style>").append(CSS).append("</style></head><body>\n");
        html.append("<h1>").append(escape(bundle.name())).append("</h1>\n<p class=\"sub\">created ")
                .append(escape(manifest.created().orElse(""))).append(" · ").append(bundle.labels().size()).append(" labels · ")
                .append(training.map(Manifest.Training::trainRows).orElse(0)).append(" training rows, ")
                .append(training.map(Manifest.Training::testRows).orElse(0)).append(" test rows · ")
                .append(escape(manifest.classifier().map(Manifest.Classifier::kind).orElse(""))).append("</p>\n");
        metricsTable(html, metrics);
        rowsTable(html, training, manifest.duplicates());
        manifest.search().ifPresent(search -> SearchReport.append(html, search));
        confusion(html, bundle.labels(), confusionOf(manifest));
        foldSpread(html, metrics.map(Manifest.Metrics::cv).orElse(Collections.emptySortedMap()));
        features(html, bundle);
        html.append("<h2>Config and provenance</h2>\n<pre>")
                .append(escape(pretty(manifest.provenance().<JsonNode>map(Manifest.Provenance::toJson).orElse(MissingNode.getInstance()))))
                .append("</pre>\n");
        html.append("</body></html>\n");
        return html.toString();
    }

    private static Manifest.Confusion confusionOf(Manifest manifest) {
        return manifest.metrics().flatMap(Manifest.Metrics::testConfusion).orElse(new Manifest.Confusion(List.of(), Optional.empty()));
    }

    private static void metricsTable(StringBuilder html, Optional<Manifest.Metrics> metrics) {
        html.append("<h2>Metrics</h2>\n<table class=\"metrics\"><thead><tr><th>metric</th><th>cross-validation (mean ± s.e.)</th><th>test</th></tr></thead><tbody>\n");
        Map<String, Manifest.CvScore> cv = metrics.map(Manifest.Metrics::cv).orElse(Collections.emptySortedMap());
        for (Map.Entry<String, Manifest.CvScore> metric : cv.entrySet()) {
            Double test = metrics.get().test().get(metric.getKey());
            html.append("<tr><td>").append(escape(metric.getKey().replace('_', ' '))).append("</td><td>")
                    .append(format(metric.getValue().mean())).append(" ± ")
                    .append(format(metric.getValue().standardError())).append("</td><td>")
                    .append(format(test == null ? Double.NaN : test)).append("</td></tr>\n");
        }
        html.append("</tbody></table>\n");
    }

    /** The rows of each part, the groups (with data.group or grouped duplicates), and the duplicate texts. */
    private static void rowsTable(StringBuilder html, Optional<Manifest.Training> training, Optional<DuplicateCounts> duplicates) {
        html.append("<h2>Rows, groups and duplicate texts</h2>\n<table class=\"metrics rows\"><tbody>\n");
        row(html, "training rows", Integer.toString(training.map(Manifest.Training::trainRows).orElse(0)));
        row(html, "test rows", Integer.toString(training.map(Manifest.Training::testRows).orElse(0)));
        training.ifPresent(figures -> {
            figures.groups().ifPresent(groups -> row(html, "groups", Integer.toString(groups)));
            figures.testFractionAchieved().ifPresent(fraction ->
                    row(html, "test fraction achieved", String.format(Locale.ROOT, "%.4f", fraction)));
        });
        duplicates.ifPresent(counts -> {
            row(html, "duplicates setting", counts.setting());
            row(html, "rows dropped as repeats", Integer.toString(counts.droppedRows()));
            row(html, "texts repeated in training", tally(counts.withinTrain(), "rows"));
            row(html, "texts repeated in test", tally(counts.withinTest(), "rows"));
            row(html, "texts on both sides of the split", tally(counts.acrossSplit(), "test rows"));
            row(html, "texts with conflicting labels", tally(counts.conflictingLabels(), "rows"));
        });
        html.append("</tbody></table>\n");
    }

    private static String tally(DuplicateCounts.Tally tally, String rows) {
        return tally.texts() + " (" + tally.rows() + " " + rows + ")";
    }

    private static void row(StringBuilder html, String name, String value) {
        html.append("<tr><td>").append(escape(name)).append("</td><td>").append(escape(value)).append("</td></tr>\n");
    }

    private static void confusion(StringBuilder html, List<String> labels, Manifest.Confusion counts) {
        html.append("<h2>Confusion matrix (test part; rows truth, columns prediction)</h2>\n");
        confusionChart(html, labels, counts, false);
    }

    /**
     * The test part's confusion matrix as a heat map, one standalone {@code <svg>} element: rows
     * are the true labels, columns the predicted ones, the diagonal in one hue and the errors in
     * another, each cell's shade its count over the largest count.
     */
    public static String confusionSvg(Bundle bundle) {
        StringBuilder svg = new StringBuilder(4096);
        confusionChart(svg, bundle.labels(), confusionOf(bundle.typedManifest()), true);
        return svg.toString();
    }

    private static void confusionChart(StringBuilder html, List<String> labels, Manifest.Confusion counts, boolean standalone) {
        int k = labels.size();
        int cell = 56;
        int left = 130;
        int top = 30;
        long max = 1;
        for (List<Long> row : counts.counts()) {
            for (long count : row) {
                max = Math.max(max, count);
            }
        }
        openSvg(html, "confusion matrix", left + cell * k + 10, top + cell * k + 10, standalone);
        for (int p = 0; p < k; p++) {
            html.append(String.format(Locale.ROOT, "<text x=\"%d\" y=\"%d\" class=\"axis\" text-anchor=\"middle\">%s</text>%n",
                    left + cell * p + cell / 2, top - 8, escape(shorten(labels.get(p)))));
        }
        for (int t = 0; t < k; t++) {
            html.append(String.format(Locale.ROOT, "<text x=\"%d\" y=\"%d\" class=\"axis\" text-anchor=\"end\">%s</text>%n",
                    left - 8, top + cell * t + cell / 2 + 4, escape(shorten(labels.get(t)))));
            for (int p = 0; p < k; p++) {
                long count = counts.count(t, p);
                double shade = (double) count / max;
                html.append(String.format(Locale.ROOT,
                        "<rect x=\"%d\" y=\"%d\" width=\"%d\" height=\"%d\" fill=\"%s\" fill-opacity=\"%.3f\" stroke=\"#8a8f98\" stroke-width=\"0.5\"/>"
                                + "<text x=\"%d\" y=\"%d\" text-anchor=\"middle\" class=\"%s\">%d</text>%n",
                        left + cell * p, top + cell * t, cell, cell, t == p ? "#2f6f5e" : "#a04a2c", 0.08 + 0.92 * shade,
                        left + cell * p + cell / 2, top + cell * t + cell / 2 + 4, shade > 0.55 ? "count light" : "count", count));
            }
        }
        html.append("</svg>\n");
    }

    private static void foldSpread(StringBuilder html, Map<String, Manifest.CvScore> cv) {
        int width = 420;
        int rowHeight = 22;
        int left = 150;
        List<Map.Entry<String, Manifest.CvScore>> metrics = new ArrayList<>(cv.entrySet());
        html.append("<h2>Per-fold spread</h2>\n");
        openSvg(html, "per-fold values", left + width + 20, rowHeight * metrics.size() + 30, false);
        for (int tick = 0; tick <= 4; tick++) {
            double x = left + width * tick / 4.0;
            html.append(String.format(Locale.ROOT, "<line x1=\"%.1f\" y1=\"0\" x2=\"%.1f\" y2=\"%d\" class=\"grid\"/><text x=\"%.1f\" y=\"%d\" class=\"axis\" text-anchor=\"middle\">%.2f</text>%n",
                    x, x, rowHeight * metrics.size(), x, rowHeight * metrics.size() + 16, tick / 4.0));
        }
        for (int m = 0; m < metrics.size(); m++) {
            int y = m * rowHeight + rowHeight / 2;
            html.append(String.format(Locale.ROOT, "<text x=\"%d\" y=\"%d\" class=\"axis\" text-anchor=\"end\">%s</text>%n",
                    left - 8, y + 4, escape(metrics.get(m).getKey().replace('_', ' '))));
            for (double value : metrics.get(m).getValue().perFold()) {
                double v = Math.max(-1, Math.min(1, value));
                html.append(String.format(Locale.ROOT, "<circle cx=\"%.1f\" cy=\"%d\" r=\"3.5\" class=\"dot\"/>", left + width * Math.max(0, v), y));
            }
            double mean = metrics.get(m).getValue().mean();
            html.append(String.format(Locale.ROOT, "<line x1=\"%.1f\" y1=\"%d\" x2=\"%.1f\" y2=\"%d\" class=\"mean\"/>%n",
                    left + width * Math.max(0, mean), y - 8, left + width * Math.max(0, mean), y + 8));
        }
        html.append("</svg>\n");
    }

    private static void features(StringBuilder html, Bundle bundle) {
        html.append("<h2>Features with the largest weights</h2>\n<div class=\"bars\">\n");
        for (String label : scoredLabels(bundle)) {
            html.append("<section><h3>").append(escape(label)).append("</h3>\n");
            html.append("<p class=\"bar-title\">").append(escape("towards " + label)).append("</p>\n");
            featureBars(html, bundle, label, true, TOP_FEATURES, false);
            html.append("<p class=\"bar-title\">").append(escape("away from " + label)).append("</p>\n");
            featureBars(html, bundle, label, false, TOP_FEATURES, false);
            html.append("</section>\n");
        }
        html.append("</div>\n");
    }

    /** The labels the model has a score for: every label, or only the second of a binary model. */
    private static List<String> scoredLabels(Bundle bundle) {
        List<String> labels = new ArrayList<>();
        for (int score = 0; score < bundle.model().weights().numScores(); score++) {
            labels.add(bundle.labelOfScore(score));
        }
        return labels;
    }

    /**
     * The {@code count} features with the largest weights towards {@code label} (or, with {@code
     * towards} false, away from it) as horizontal bars, one standalone {@code <svg>} element; each
     * bar's length is its weight over the largest shown. For a binary model, the first label's
     * features towards it are the second label's away from it.
     */
    public static String featureBarsSvg(Bundle bundle, String label, boolean towards, int count) {
        StringBuilder svg = new StringBuilder(4096);
        featureBars(svg, bundle, label, towards, count, true);
        return svg.toString();
    }

    private static void featureBars(StringBuilder html, Bundle bundle, String label, boolean towards, int count, boolean standalone) {
        if (count < 1) {
            throw new IllegalArgumentException("count must be >= 1, was " + count);
        }
        LinearWeights weights = bundle.model().weights();
        int score;
        boolean flipped = false;
        if (weights.numScores() == 1 && bundle.labels().size() == 2 && bundle.labels().get(0).equals(label)) {
            score = 0;
            flipped = true;
        } else {
            score = scoredLabels(bundle).indexOf(label);
        }
        if (score < 0) {
            throw new IllegalArgumentException("label must be one of " + String.join(", ", bundle.labels()) + ", was \"" + label + "\"");
        }
        List<Integer> order = bundle.featuresByWeight(score);
        List<Integer> chosen;
        if (towards != flipped) {
            chosen = order.subList(0, Math.min(count, order.size()));
        } else {
            chosen = new ArrayList<>(order.subList(Math.max(0, order.size() - count), order.size()));
            java.util.Collections.reverse(chosen);
        }
        bars(html, (towards ? "towards " : "away from ") + label, chosen, weights, score, flipped, bundle.pipeline().features(), standalone);
    }

    private static void bars(StringBuilder html, String title, List<Integer> features, LinearWeights weights, int score, boolean flipped,
                             FeatureSpace space, boolean standalone) {
        double max = 1e-12;
        for (int j : features) {
            max = Math.max(max, Math.abs(weights.weight(score, j)));
        }
        int left = 170;
        int width = 200;
        int row = 16;
        openSvg(html, title, left + width + 70, row * features.size() + 4, standalone);
        for (int i = 0; i < features.size(); i++) {
            int j = features.get(i);
            double w = flipped ? -weights.weight(score, j) : weights.weight(score, j);
            double length = width * Math.abs(w) / max;
            html.append(String.format(Locale.ROOT,
                    "<text x=\"%d\" y=\"%d\" class=\"axis\" text-anchor=\"end\">%s</text><rect x=\"%d\" y=\"%d\" width=\"%.1f\" height=\"%d\" class=\"%s\"/>"
                            + "<text x=\"%.1f\" y=\"%d\" class=\"axis\">%s</text>%n",
                    left - 6, i * row + 12, escape(shorten(space.featureName(j))), left, i * row + 3, length, row - 4,
                    w >= 0 ? "pos" : "neg", left + length + 4, i * row + 12, format(w)));
        }
        html.append("</svg>\n");
    }

    /**
     * An SVG element that scales down to its container (its view box). A standalone one names its
     * namespace so that it parses as XML on its own; inside the report's HTML the parser supplies it.
     */
    private static void openSvg(StringBuilder html, String label, int width, int height, boolean standalone) {
        html.append(String.format(Locale.ROOT, "<svg %sclass=\"chart\" role=\"img\" aria-label=\"%s\" width=\"%d\" height=\"%d\" "
                + "viewBox=\"0 0 %d %d\">%n", standalone ? "xmlns=\"" + SVG_NAMESPACE + "\" " : "", escape(label), width, height, width, height));
    }

    private static String pretty(JsonNode node) {
        try {
            return PRETTY.writeValueAsString(node);
        } catch (com.fasterxml.jackson.core.JsonProcessingException e) {
            return node.toString();
        }
    }

    private static String format(double value) {
        return Double.isNaN(value) ? "–" : String.format(Locale.ROOT, "%.3f", value);
    }

    private static String shorten(String text) {
        return text.length() <= 24 ? text : text.substring(0, 23) + "…";
    }

    static String escape(String text) {
        StringBuilder out = new StringBuilder(text.length());
        for (int i = 0; i < text.length(); i++) {
            char c = text.charAt(i);
            switch (c) {
                case '<' -> out.append("&lt;");
                case '>' -> out.append("&gt;");
                case '&' -> out.append("&amp;");
                case '"' -> out.append("&quot;");
                case '\'' -> out.append("&#39;");
                default -> out.append(c);
            }
        }
        return out.toString();
    }

    private static final String CSS = """
            body{font:14px/1.45 system-ui,sans-serif;color:#1d2430;max-width:1100px;margin:2rem auto;padding:0 1rem}
            h1{font-size:1.6rem;margin:0}.sub{color:#5b6472;margin-top:.2rem}
            h2{font-size:1.15rem;border-bottom:1px solid #d5d9df;padding-bottom:.2rem;margin-top:2rem}
            h3{font-size:1rem;margin:.4rem 0}
            table.metrics{border-collapse:collapse}table.metrics td,table.metrics th{padding:.25rem .8rem;border-bottom:1px solid #e4e7eb;text-align:left}
            table.metrics td:nth-child(n+2){font-variant-numeric:tabular-nums}table.search tr.chosen td{font-weight:600;background:#e8f2ee}
            .chart text{font:11px system-ui,sans-serif;fill:#333}.count{font-weight:600}.count.light{fill:#fff}
            .grid{stroke:#e4e7eb}.dot{fill:#3d5a80;fill-opacity:.7}.mean{stroke:#1d2430;stroke-width:2}
            .pos{fill:#2f6f5e}.neg{fill:#a04a2c}.bar-title{margin:.3rem 0 0;color:#5b6472}
            .bars{display:flex;flex-wrap:wrap;gap:1.5rem}section{break-inside:avoid}
            pre{background:#f4f5f7;padding:.8rem;overflow:auto;font-size:12px}
            @media print{body{margin:0;max-width:none}h2{break-after:avoid}svg{break-inside:avoid}}
            """;
}
