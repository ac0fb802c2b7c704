package dev.pressmark.core.drift;

import dev.pressmark.core.PressmarkException;

/** A training profile that cannot be used for drift checks; the message names the source and the field. */
public final class DriftException extends PressmarkException {

    private static final long serialVersionUID = 1L;

    /** The bundle's {@code profile.json} lacks a field, or a field has the wrong type or an impossible value. */
    public static final String PROFILE = "drift-profile";

    public DriftException(String code, String message, Throwable cause) {
        super(code, message, cause);
    }

    public DriftException(String code, String message) {
        super(code, message);
    }
}
