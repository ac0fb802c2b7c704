package dev.pressmark.store;

import java.time.Instant;
import java.util.Objects;

/**
 * A running shadow: {@code tag} of {@code model} is scored beside the active version on a
 * {@code fraction} of the requests the active version answers. {@code startedAt} identifies the
 * run; every start is a new run, and reports are kept per run.
 */
public record Shadow(String model, String tag, double fraction, Instant startedAt, String actor) {

    /** The share of requests sampled when none is given: 0.2, enough for a report within minutes at modest traffic. */
    public static final double DEFAULT_FRACTION = 0.2;

    public Shadow {
        Objects.requireNonNull(model, "model");
        Objects.requireNonNull(tag, "tag");
        Objects.requireNonNull(startedAt, "startedAt");
        Objects.requireNonNull(actor, "actor");
        checkFraction(fraction);
    }

    /** Refuses a fraction outside (0, 1], naming the bound. */
    public static double checkFraction(double fraction) {
        if (!(fraction > 0.0 && fraction <= 1.0)) {
            throw new StoreException(StoreException.INVALID_FRACTION, "fraction must be in (0, 1] (a share of requests), was " + fraction);
        }
        return fraction;
    }
}
