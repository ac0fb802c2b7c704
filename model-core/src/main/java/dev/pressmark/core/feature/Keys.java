package dev.pressmark.core.feature;

/** The error for a config value that names no known option. */
final class Keys {

    private Keys() {
    }

    /** "unknown features.scaling 'l1', expected one of l2, standardize, none". */
    static IllegalArgumentException unknown(String field, String key, Enum<?>[] allowed) {
        StringBuilder known = new StringBuilder();
        for (Enum<?> option : allowed) {
            known.append(known.length() == 0 ? "" : ", ").append(option);
        }
        String shown = key == null ? "null" : "'" + key + "'";
        return new IllegalArgumentException("unknown " + field + " " + shown + ", expected one of " + known);
    }
}
