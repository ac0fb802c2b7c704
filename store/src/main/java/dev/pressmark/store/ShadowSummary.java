package dev.pressmark.store;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.IOException;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.SortedMap;
import java.util.TreeMap;

/**
 * What a shadow run found: how many items the candidate scored beside the active version, how
 * many requests were dropped unscored, how often the two gave the same label, the table of
 * active label against candidate label, and the distribution of the score difference.
 *
 * <p>The score difference of one item is the candidate's probability of the label the active
 * version gave minus the active version's own ({@link #PROBABILITY}) when both versions give
 * probabilities, else the candidate's winning score minus the active's ({@link #SCORE}). Its
 * absolute values are counted in fixed bins ({@link #DIFFERENCE_BOUNDS}) so that replicas'
 * summaries add up exactly; the quantiles are therefore upper bounds, each the bin edge at or
 * above the true quantile (and never above the largest difference seen).
 */
public record ShadowSummary(String active, String candidate, String basis, long samples, long dropped, long agreeing,
        SortedMap<String, SortedMap<String, Long>> labels, List<Long> differenceCounts, double differenceSum, double maxAbsDifference) {

    public static final String PROBABILITY = "probability";
    public static final String SCORE = "score";
    /** Upper edges of the bins of |difference|; a last bin holds everything above the last edge. */
    public static final double[] DIFFERENCE_BOUNDS = {0.001, 0.002, 0.005, 0.01, 0.02, 0.05, 0.1, 0.2, 0.5, 1, 2, 5, 10};

    private static final ObjectMapper JSON = new ObjectMapper();

    public ShadowSummary {
        Objects.requireNonNull(active, "active");
        Objects.requireNonNull(candidate, "candidate");
        Objects.requireNonNull(basis, "basis");
        if (samples < 0 || dropped < 0 || agreeing < 0 || agreeing > samples) {
            throw new IllegalArgumentException("counts must be >= 0 with agreeing <= samples, were samples " + samples + ", dropped " + dropped
                    + ", agreeing " + agreeing);
        }
        SortedMap<String, SortedMap<String, Long>> copy = new TreeMap<>();
        labels.forEach((a, row) -> copy.put(a, new TreeMap<>(row)));
        labels = copy;
        differenceCounts = List.copyOf(differenceCounts);
        if (differenceCounts.size() != DIFFERENCE_BOUNDS.length + 1) {
            throw new IllegalArgumentException("differenceCounts must have " + (DIFFERENCE_BOUNDS.length + 1) + " bins, had " + differenceCounts.size());
        }
    }

    /** An empty summary of one pair of versions. */
    public static ShadowSummary empty(String active, String candidate) {
        List<Long> zeros = new ArrayList<>();
        for (int i = 0; i <= DIFFERENCE_BOUNDS.length; i++) {
            zeros.add(0L);
        }
        return new ShadowSummary(active, candidate, SCORE, 0, 0, 0, new TreeMap<>(), zeros, 0.0, 0.0);
    }

    /** The share of scored items on which both versions gave the same label; NaN before any. */
    public double agreement() {
        return samples == 0 ? Double.NaN : (double) agreeing / samples;
    }

    public double meanDifference() {
        return samples == 0 ? Double.NaN : differenceSum / samples;
    }

    /**
     * An upper bound of the {@code q}-quantile of |difference|: the edge of the bin that holds the
     * item of rank ceil(q·n), capped at the largest |difference| seen. NaN before any item.
     */
    public double absDifferenceQuantile(double q) {
        if (!(q > 0 && q <= 1)) {
            throw new IllegalArgumentException("q must be in (0, 1], was " + q);
        }
        if (samples == 0) {
            return Double.NaN;
        }
        long rank = (long) Math.ceil(q * samples);
        long seen = 0;
        for (int bin = 0; bin < DIFFERENCE_BOUNDS.length; bin++) {
            seen += differenceCounts.get(bin);
            if (seen >= rank) {
                return Math.min(DIFFERENCE_BOUNDS[bin], maxAbsDifference);
            }
        }
        return maxAbsDifference;
    }

    /** This summary and another of the same candidate, summed (replicas of one run). */
    public ShadowSummary plus(ShadowSummary other) {
        if (!candidate.equals(other.candidate)) {
            throw new IllegalArgumentException("cannot add the summary of candidate " + other.candidate + " to one of " + candidate);
        }
        SortedMap<String, SortedMap<String, Long>> table = new TreeMap<>();
        labels.forEach((a, row) -> table.put(a, new TreeMap<>(row)));
        other.labels.forEach((a, row) -> row.forEach((c, n) -> table.computeIfAbsent(a, k -> new TreeMap<>()).merge(c, n, Long::sum)));
        List<Long> counts = new ArrayList<>();
        for (int i = 0; i < differenceCounts.size(); i++) {
            counts.add(differenceCounts.get(i) + other.differenceCounts.get(i));
        }
        // an empty summary has no basis of its own yet
        String joinedBasis = samples == 0 ? other.basis : other.samples == 0 || basis.equals(other.basis) ? basis : "mixed";
        // replicas differ in the active version only while one of them lags a change; say so rather than hide it
        String joinedActive = active.equals(other.active) ? active : active + "," + other.active;
        return new ShadowSummary(joinedActive, candidate, joinedBasis, samples + other.samples, dropped + other.dropped, agreeing + other.agreeing,
                table, counts, differenceSum + other.differenceSum, Math.max(maxAbsDifference, other.maxAbsDifference));
    }

    /** The JSON form the store keeps and the service reports. */
    public ObjectNode toJson() {
        ObjectNode node = JSON.createObjectNode();
        node.put("active", active);
        node.put("candidate", candidate);
        node.put("samples", samples);
        node.put("dropped", dropped);
        node.put("agreeing", agreeing);
        putNumber(node, "agreement", agreement());
        ObjectNode table = node.putObject("labels");
        labels.forEach((a, row) -> {
            ObjectNode r = table.putObject(a);
            row.forEach(r::put);
        });
        ObjectNode difference = node.putObject("score_difference");
        difference.put("basis", basis);
        difference.put("count", samples);
        difference.put("sum", differenceSum);
        putNumber(difference, "mean", meanDifference());
        difference.put("max_abs", maxAbsDifference);
        putNumber(difference, "p50", absDifferenceQuantile(0.5));
        putNumber(difference, "p90", absDifferenceQuantile(0.9));
        putNumber(difference, "p99", absDifferenceQuantile(0.99));
        ArrayNode bounds = difference.putArray("bounds");
        for (double bound : DIFFERENCE_BOUNDS) {
            bounds.add(bound);
        }
        ArrayNode counts = difference.putArray("counts");
        differenceCounts.forEach(counts::add);
        return node;
    }

    private static void putNumber(ObjectNode node, String field, double value) {
        if (Double.isNaN(value)) {
            node.putNull(field);
        } else {
            node.put(field, value);
        }
    }

    /** Reads {@link #toJson()}'s form back. */
    public static ShadowSummary fromJson(String text) {
        JsonNode node;
        try {
            node = JSON.readTree(text);
        } catch (IOException e) {
            throw new StoreException(StoreException.BAD_REPORT, "a stored shadow report is not JSON: " + e.getMessage(), e);
        }
        try {
            JsonNode difference = node.required("score_difference");
            SortedMap<String, SortedMap<String, Long>> table = new TreeMap<>();
            for (Map.Entry<String, JsonNode> row : node.required("labels").properties()) {
                SortedMap<String, Long> cells = new TreeMap<>();
                for (Map.Entry<String, JsonNode> cell : row.getValue().properties()) {
                    cells.put(cell.getKey(), cell.getValue().asLong());
                }
                table.put(row.getKey(), cells);
            }
            List<Long> counts = new ArrayList<>();
            difference.required("counts").forEach(n -> counts.add(n.asLong()));
            return new ShadowSummary(node.required("active").asText(), node.required("candidate").asText(), difference.required("basis").asText(),
                    node.required("samples").asLong(), node.required("dropped").asLong(), node.required("agreeing").asLong(), table, counts,
                    difference.required("sum").asDouble(), difference.required("max_abs").asDouble());
        } catch (IllegalArgumentException e) {
            throw new StoreException(StoreException.BAD_REPORT, "a stored shadow report is malformed: " + e.getMessage(), e);
        }
    }

    /**
     * Counts one run's items as they are scored. Not thread-safe: one thread adds, and
     * {@link #summary()} is called under the same lock as {@link #add}.
     */
    public static final class Tally {

        private final String active;
        private final String candidate;
        private String basis;
        private long samples;
        private long dropped;
        private long agreeing;
        private final SortedMap<String, SortedMap<String, Long>> labels = new TreeMap<>();
        private final long[] counts = new long[DIFFERENCE_BOUNDS.length + 1];
        private double sum;
        private double maxAbs;

        public Tally(String active, String candidate) {
            this.active = Objects.requireNonNull(active, "active");
            this.candidate = Objects.requireNonNull(candidate, "candidate");
        }

        /** One item: the two labels and the score difference on {@code itemBasis}. */
        public void add(String activeLabel, String candidateLabel, double difference, String itemBasis) {
            basis = basis == null || basis.equals(itemBasis) ? itemBasis : "mixed";
            samples++;
            if (activeLabel.equals(candidateLabel)) {
                agreeing++;
            }
            labels.computeIfAbsent(activeLabel, k -> new TreeMap<>()).merge(candidateLabel, 1L, Long::sum);
            double abs = Math.abs(difference);
            int bin = 0;
            while (bin < DIFFERENCE_BOUNDS.length && abs > DIFFERENCE_BOUNDS[bin]) {
                bin++;
            }
            counts[bin]++;
            sum += difference;
            maxAbs = Math.max(maxAbs, abs);
        }

        /** Items of a sampled request that were never scored (the queue was full). */
        public void dropped(long items) {
            dropped += items;
        }

        public ShadowSummary summary() {
            List<Long> bins = new ArrayList<>(counts.length);
            for (long n : counts) {
                bins.add(n);
            }
            return new ShadowSummary(active, candidate, basis == null ? SCORE : basis, samples, dropped, agreeing, labels, bins, sum, maxAbs);
        }
    }
}
