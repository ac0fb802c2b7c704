package dev.pressmark.store.lifecycle;

import dev.pressmark.core.PressmarkException;
import dev.pressmark.store.Activation;
import dev.pressmark.store.BundleStore;
import dev.pressmark.store.LoadedBundle;
import dev.pressmark.store.ShadowSummary;
import dev.pressmark.store.StoreException;
import dev.pressmark.store.Version;
import java.util.Objects;
import java.util.Optional;

/**
 * The one rule for making a version active, below both front doors: the command line's
 * {@code activate} and the HTTP service's {@code PUT /models/{name}/active} parse, call
 * {@link #activate}, and render what it returns or throws.
 *
 * <p>In order: the candidate's promotion check against the version active now
 * ({@link PromotionCheck}); a refusal unless forced with a reason; loading the candidate in this
 * process within the bundle limits, so that nothing this process cannot load becomes active; and
 * the activation as a compare-and-set on the active tag the check saw
 * ({@link BundleStore#activate(String, String, Optional, String, String)}). If another client
 * activated a version in between, the activation fails with {@link StoreException#ACTIVE_CHANGED}
 * and changes nothing: the check would have to be made again against the new active version.
 */
public final class Promotion {

    private Promotion() {
    }

    /**
     * An activation as asked.
     *
     * @param model the model
     * @param tag the version to make active
     * @param force activate even when the check refuses; needs a reason
     * @param reason why, for the events; may be empty unless forced
     * @param policy what the check compares
     * @param actor who asked
     */
    public record Request(String model, String tag, boolean force, String reason, PromotionPolicy policy, String actor) {
        public Request {
            Objects.requireNonNull(model, "model");
            Objects.requireNonNull(tag, "tag");
            Objects.requireNonNull(reason, "reason");
            Objects.requireNonNull(policy, "policy");
            Objects.requireNonNull(actor, "actor");
            if (force && reason.isBlank()) {
                throw new IllegalArgumentException("reason is required when forcing past the promotion check, and goes into the events");
            }
        }
    }

    /** What an activation did: the activation row, the check's outcome, and whether it went past a refusal. */
    public record Result(Activation activation, PromotionCheck.Outcome outcome, boolean forced) {
        public Result {
            Objects.requireNonNull(activation, "activation");
            Objects.requireNonNull(outcome, "outcome");
        }
    }

    /** The promotion check refused and the request did not force; {@link #outcome()} lists each refusal. */
    public static final class Refused extends PressmarkException {

        private static final long serialVersionUID = 1L;

        /** The stable code of a refusal. */
        public static final String CODE = "promotion-refused";

        private final transient PromotionCheck.Outcome outcome;

        Refused(String model, String tag, PromotionCheck.Outcome outcome) {
            super(CODE, "not activating " + model + " " + tag + ": " + outcome.describe());
            this.outcome = outcome;
        }

        public PromotionCheck.Outcome outcome() {
            return outcome;
        }
    }

    /**
     * Checks, loads and activates as the class comment says. {@code shadow} is the candidate's
     * shadow summary against the active version, when there is one.
     *
     * @throws Refused when the check refuses and the request does not force
     * @throws StoreException {@link StoreException#RETIRED} when the candidate is retired, {@link StoreException#UNUSABLE} or {@link StoreException#LIMIT} when the
     *     candidate does not load here, {@link StoreException#ACTIVE_CHANGED} when another version
     *     became active since the check, or any failure of the store
     */
    public static Result activate(BundleStore store, Request request, Optional<ShadowSummary> shadow) {
        String model = request.model();
        String tag = request.tag();
        Version candidate = store.version(model, tag).orElseThrow(() -> new StoreException(StoreException.NO_SUCH_VERSION,
                "no version " + tag + " of model " + model + " in the store"));
        if (candidate.retired()) {
            // the activating transaction refuses it too; said here first so that the answer is this, not a promotion check's
            throw new StoreException(StoreException.RETIRED, model + " " + tag + " is retired and cannot be activated");
        }
        Optional<Version> active = store.activeVersion(model);
        PromotionCheck.Outcome outcome = PromotionCheck.check(candidate, active, shadow, request.policy());
        if (!outcome.passed() && !request.force()) {
            throw new Refused(model, tag, outcome);
        }
        LoadedBundle loaded = store.load(model, tag);
        PublishCheck.load(loaded.contents(), model, tag, "cannot activate ");
        String reason = request.force()
                ? "forced" + (outcome.passed() ? "" : " past the promotion check (" + outcome.describe() + ")") + ": " + request.reason()
                : request.reason();
        Activation activation = store.activate(model, tag, active.map(Version::tag), request.actor(), reason);
        return new Result(activation, outcome, request.force() && !outcome.passed());
    }
}
