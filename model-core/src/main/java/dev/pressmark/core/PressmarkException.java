package dev.pressmark.core;

import java.util.Objects;

/**
 * The root of every error that pressmark raises on purpose. The {@link #code()} is stable and
 * machine-readable; the message says what was wrong and where (file, line, field).
 */
public class PressmarkException extends RuntimeException {

    private static final long serialVersionUID = 1L;

    private final String code;

    public PressmarkException(String code, String message) {
        super(message);
        this.code = Objects.requireNonNull(code, "code");
    }

    public PressmarkException(String code, String message, Throwable cause) {
        super(message, cause);
        this.code = Objects.requireNonNull(code, "code");
    }

    /** A stable, lower-case, dash-separated identifier such as {@code invalid-vocabulary}. */
    public String code() {
        return code;
    }
}
