package dev.pressmark.store;

import java.util.regex.Pattern;

/**
 * The patterns of model names, version tags and actors that every store operation checks, as the
 * design fixes them.
 */
public final class Names {

    public static final String MODEL_PATTERN = "[a-z0-9][a-z0-9-]{0,63}";
    public static final String TAG_PATTERN = "[A-Za-z0-9][A-Za-z0-9._-]{0,63}";
    public static final int MAX_ACTOR_CHARS = 200;
    /** The longest reason a change records in its event. */
    public static final int MAX_REASON_CHARS = 1_000;

    private static final Pattern MODEL = Pattern.compile(MODEL_PATTERN);
    private static final Pattern TAG = Pattern.compile(TAG_PATTERN);

    private Names() {
    }

    public static String model(String name) {
        if (name == null || !MODEL.matcher(name).matches()) {
            throw new StoreException(StoreException.INVALID_NAME, "model name " + quoted(name) + " must match " + MODEL_PATTERN);
        }
        return name;
    }

    public static String tag(String tag) {
        if (tag == null || !TAG.matcher(tag).matches()) {
            throw new StoreException(StoreException.INVALID_TAG, "tag " + quoted(tag) + " must match " + TAG_PATTERN);
        }
        return tag;
    }

    public static String actor(String actor) {
        if (actor == null || actor.isBlank() || actor.length() > MAX_ACTOR_CHARS) {
            throw new IllegalArgumentException("actor must be 1 to " + MAX_ACTOR_CHARS + " characters, was " + quoted(actor));
        }
        return actor;
    }

    /** A reason a change must give: not blank, at most {@value #MAX_REASON_CHARS} characters; returned stripped. */
    public static String requiredReason(String reason) {
        String stripped = reason == null ? "" : reason.strip();
        if (stripped.isEmpty()) {
            throw new StoreException(StoreException.INVALID_REASON, "a reason is required and goes into the events; it was empty");
        }
        if (stripped.length() > MAX_REASON_CHARS) {
            throw new StoreException(StoreException.INVALID_REASON, "a reason must have at most " + MAX_REASON_CHARS + " characters, had "
                    + stripped.length());
        }
        return stripped;
    }

    private static String quoted(String text) {
        if (text == null) {
            return "null";
        }
        String shown = text.length() > 80 ? text.substring(0, 80) + "..." : text;
        return "\"" + shown.replace("\"", "\\\"") + "\"";
    }
}
