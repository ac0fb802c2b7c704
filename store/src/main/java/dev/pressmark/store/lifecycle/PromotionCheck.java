package dev.pressmark.store.lifecycle;

import dev.pressmark.core.bundle.Manifest;
import dev.pressmark.store.ShadowSummary;
import dev.pressmark.store.StoreException;
import dev.pressmark.store.Version;
import java.math.BigDecimal;
import java.util.ArrayList;
import java.util.List;
import java.util.Objects;
import java.util.Optional;
import java.util.OptionalDouble;

/**
 * Whether a candidate version may replace the active one. Pure: it reads the two versions'
 * manifests and, when there is one, the shadow summary of the candidate against the active
 * version, and decides by a {@link PromotionPolicy}. {@link Promotion}, which the command line and
 * the HTTP service both call, runs it before activating; a rollback never does, since it is the
 * way back in an emergency.
 *
 * <p>The metric comes from the manifests' {@code metrics.test} (the held-out split), else from
 * {@code metrics.cv} ({@code mean} of the cross-validation folds), the same source for both
 * versions. The drop is computed in decimal from the values as the manifests write them, so a
 * drop of exactly the margin (0.90 against 0.88 with 0.02) passes, as the words "lower by more
 * than the margin" say, with no binary rounding deciding it.
 *
 * <p>It refuses when the active version has the metric and the candidate's is lower by more than
 * {@code maxDrop}; when the active version has it and the candidate lacks it (nothing shows it
 * is no worse); or when {@code minAgreement} is above 0 and a shadow summary of this candidate
 * with at least {@code minSamples} items agrees less often. It passes when nothing is active,
 * when the active version does not record the metric, and when a shadow has too few items or
 * compared the candidate with another version than the one active now.
 */
public final class PromotionCheck {

    public static final String METRIC_DROP = "metric-drop";
    public static final String METRIC_MISSING = "metric-missing";
    public static final String SHADOW_AGREEMENT = "shadow-agreement";


    private PromotionCheck() {
    }

    /**
     * One reason to refuse. {@code active} and {@code candidate} are the compared values (NaN
     * where a version lacks it), {@code limit} the margin or the least agreement, {@code source}
     * {@code test}, {@code cv} or {@code shadow}.
     */
    public record Refusal(String kind, String metric, String source, double active, double candidate, double limit, String message) {
        public Refusal {
            Objects.requireNonNull(kind, "kind");
            Objects.requireNonNull(metric, "metric");
            Objects.requireNonNull(source, "source");
            Objects.requireNonNull(message, "message");
        }
    }

    /** What the check found: the refusals (none when it passes) and what it could not compare. */
    public record Outcome(List<Refusal> refusals, List<String> notes) {
        public Outcome {
            refusals = List.copyOf(refusals);
            notes = List.copyOf(notes);
        }

        public boolean passed() {
            return refusals.isEmpty();
        }

        /** The refusals as one line each, joined; empty when it passed. */
        public String describe() {
            return String.join("; ", refusals.stream().map(Refusal::message).toList());
        }
    }

    public static Outcome check(Version candidate, Optional<Version> active, Optional<ShadowSummary> shadow, PromotionPolicy policy) {
        Objects.requireNonNull(candidate, "candidate");
        Objects.requireNonNull(policy, "policy");
        List<Refusal> refusals = new ArrayList<>();
        List<String> notes = new ArrayList<>();
        if (active.isEmpty() || active.get().tag().equals(candidate.tag())) {
            notes.add("no other version is active; nothing to compare with");
        } else {
            compareMetric(candidate, active.get(), policy, refusals, notes);
        }
        // a shadow counts only if it compared this candidate with the version active now
        shadow.filter(s -> s.candidate().equals(candidate.tag()) && active.isPresent() && s.active().equals(active.get().tag()))
                .ifPresent(s -> compareShadow(candidate, s, policy, refusals, notes));
        return new Outcome(refusals, notes);
    }

    private static void compareMetric(Version candidate, Version active, PromotionPolicy policy, List<Refusal> refusals, List<String> notes) {
        String metric = policy.metric();
        Manifest.Metrics candidateMetrics = metrics(candidate);
        Manifest.Metrics activeMetrics = metrics(active);
        String source = null;
        for (String s : new String[] {"test", "cv"}) {
            if (activeMetrics.value(s, metric).isPresent() && candidateMetrics.value(s, metric).isPresent()) {
                source = s;
                break;
            }
        }
        if (source == null) {
            OptionalDouble activeValue = activeMetrics.value("test", metric).isPresent() ? activeMetrics.value("test", metric)
                    : activeMetrics.value("cv", metric);
            if (activeValue.isEmpty()) {
                notes.add("the active version " + active.tag() + " records no " + metric + "; the metric was not compared");
                return;
            }
            refusals.add(new Refusal(METRIC_MISSING, metric, "test", activeValue.getAsDouble(), Double.NaN, policy.maxDrop(),
                    candidate.model() + " " + candidate.tag() + " records no " + metric + " to compare with the active " + active.tag() + "'s "
                    + activeValue.getAsDouble()));
            return;
        }
        double activeValue = activeMetrics.value(source, metric).getAsDouble();
        double candidateValue = candidateMetrics.value(source, metric).getAsDouble();
        BigDecimal drop = decimal(activeValue).subtract(decimal(candidateValue));
        if (drop.compareTo(BigDecimal.valueOf(policy.maxDrop())) > 0) {
            refusals.add(new Refusal(METRIC_DROP, metric, source, activeValue, candidateValue, policy.maxDrop(),
                    metric + " (" + (source.equals("test") ? "test split" : "cross-validation mean") + ") of " + candidate.model() + " "
                    + candidate.tag() + " is " + candidateValue + " against " + activeValue + " of the active "
                    + active.tag() + ": lower by " + drop.toPlainString() + ", more than the allowed " + policy.maxDrop()));
        }
    }

    private static void compareShadow(Version candidate, ShadowSummary shadow, PromotionPolicy policy, List<Refusal> refusals, List<String> notes) {
        if (policy.minAgreement() <= 0.0) {
            return;
        }
        if (shadow.samples() < policy.minSamples()) {
            notes.add("the shadow of " + candidate.tag() + " has " + shadow.samples() + " items, fewer than the " + policy.minSamples()
                    + " its agreement needs to count");
            return;
        }
        if (shadow.agreement() < policy.minAgreement()) {
            refusals.add(new Refusal(SHADOW_AGREEMENT, "agreement", "shadow", Double.NaN, shadow.agreement(), policy.minAgreement(),
                    "the shadow of " + candidate.model() + " " + candidate.tag() + " agreed with the active " + shadow.active() + " on "
                    + shadow.agreeing() + " of " + shadow.samples() + " items (" + shadow.agreement() + "), below the required "
                    + policy.minAgreement()));
        }
    }

    /** The metrics the stored manifest of {@code version} records; none recorded reads as empty. */
    private static Manifest.Metrics metrics(Version version) {
        try {
            return Manifest.parse(version.manifestJson()).metrics().orElse(Manifest.Metrics.NONE);
        } catch (IllegalArgumentException e) {
            throw new StoreException(StoreException.FAILURE, "the stored manifest of " + version.model() + " " + version.tag() + " is not JSON", e);
        }
    }

    /** A metric's value as the decimal its shortest text names, so that 0.9 - 0.8 is 0.1. */
    private static BigDecimal decimal(double value) {
        return new BigDecimal(Double.toString(value));
    }
}
