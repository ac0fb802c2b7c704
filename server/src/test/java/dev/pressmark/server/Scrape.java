package dev.pressmark.server;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.ByteArrayInputStream;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.hawkular.agent.prometheus.text.TextPrometheusMetricDataParser;
import org.hawkular.agent.prometheus.types.Counter;
import org.hawkular.agent.prometheus.types.Gauge;
import org.hawkular.agent.prometheus.types.Histogram;
import org.hawkular.agent.prometheus.types.Metric;
import org.hawkular.agent.prometheus.types.MetricFamily;
import org.hawkular.agent.prometheus.types.Summary;

/**
 * A {@code /metrics} body read by an independent parser of the Prometheus text format: the
 * text parser of org.hawkular.agent:prometheus-scraper (Maven Central), a port of the official
 * Python client's parser. That parser skips a line it cannot read (it only logs it at debug), so
 * {@link #of} also counts the body's sample lines and requires every one to be accounted for.
 */
final class Scrape {

    private final Map<String, MetricFamily> families;

    private Scrape(Map<String, MetricFamily> families) {
        this.families = families;
    }

    static Scrape of(String body) {
        Map<String, MetricFamily> families = new LinkedHashMap<>();
        try {
            TextPrometheusMetricDataParser parser = new TextPrometheusMetricDataParser(new ByteArrayInputStream(body.getBytes(StandardCharsets.UTF_8)));
            for (MetricFamily family = parser.parse(); family != null; family = parser.parse()) {
                families.put(family.getName(), family);
            }
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
        long sampleLines = body.lines().filter(line -> !line.isBlank() && !line.startsWith("#")).count();
        long parsed = 0;
        for (MetricFamily family : families.values()) {
            for (Metric metric : family.getMetrics()) {
                parsed += samples(metric);
            }
        }
        assertThat(parsed).as("samples the parser read, against the body's sample lines").isEqualTo(sampleLines);
        return new Scrape(families);
    }

    private static long samples(Metric metric) {
        if (metric instanceof Histogram h) {
            return h.getBuckets().size() + 2L;
        }
        if (metric instanceof Summary s) {
            return s.getQuantiles().size() + 2L;
        }
        return 1;
    }

    boolean has(String family) {
        return families.containsKey(family);
    }

    List<Metric> series(String family) {
        MetricFamily found = families.get(family);
        return found == null ? List.of() : found.getMetrics();
    }

    /** The histogram series with exactly these labels, or null. */
    Histogram histogram(String family, Map<String, String> labels) {
        return (Histogram) find(family, labels);
    }

    List<Histogram> histograms(String family) {
        List<Histogram> all = new ArrayList<>();
        for (Metric metric : series(family)) {
            all.add((Histogram) metric);
        }
        return all;
    }

    /** The counter's value for exactly these labels; 0 when the series is absent, as a scraper reads it. */
    double counter(String family, Map<String, String> labels) {
        Metric found = find(family, labels);
        return found == null ? 0 : ((Counter) found).getValue();
    }

    Summary summary(String family, Map<String, String> labels) {
        return (Summary) find(family, labels);
    }

    /** Each gauge series of a family: its labels and value. */
    Map<Map<String, String>, Double> gauges(String family) {
        Map<Map<String, String>, Double> values = new LinkedHashMap<>();
        for (Metric metric : series(family)) {
            values.put(metric.getLabels(), ((Gauge) metric).getValue());
        }
        return values;
    }

    private Metric find(String family, Map<String, String> labels) {
        for (Metric metric : series(family)) {
            if (metric.getLabels().equals(labels)) {
                return metric;
            }
        }
        return null;
    }
}
