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

    private static String quoted(String text) {
        if (text == null) {
            return "null";
        }
        String shown = text.length() > 80 ? text.substring(0, 80) + "..." : text;
        return "\"" + shown.replace("\"", "\\\"") + "\"";
    }
}
