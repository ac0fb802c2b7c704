package dev.pressmark.store;

import java.time.Instant;
import java.util.Objects;

/** One audit record: who did what to which model and tag, when, with a short detail. {@code tag} may be empty. */
public record StoreEvent(long id, Instant at, String actor, String action, String model, String tag, String detail) {

    /** The actions the store records. */
    public static final String PUBLISH = "publish";
    public static final String ACTIVATE = "activate";
    public static final String ROLLBACK = "rollback";
    public static final String RETIRE = "retire";
    public static final String SHADOW_START = "shadow-start";
    public static final String SHADOW_STOP = "shadow-stop";
    public static final String TRUST = "trust";
    public static final String DISTRUST = "distrust";
    /** The {@code model} of events about the store as a whole (trusted keys), which no model name can be. */
    public static final String STORE_WIDE = "";

    public StoreEvent {
        Objects.requireNonNull(at, "at");
        Objects.requireNonNull(actor, "actor");
        Objects.requireNonNull(action, "action");
        Objects.requireNonNull(model, "model");
        Objects.requireNonNull(tag, "tag");
        Objects.requireNonNull(detail, "detail");
    }
}
