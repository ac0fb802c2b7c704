package dev.pressmark.core.sign;

import dev.pressmark.core.PressmarkException;

/** A key or signature file that cannot be used. The codes are the constants of this class. */
public final class SignatureException extends PressmarkException {

    private static final long serialVersionUID = 1L;

    /** A key file that is not a PEM Ed25519 key of the expected kind. */
    public static final String INVALID_KEY = "invalid-key";
    /** A signature file that is not the JSON this program writes, or names a format version it does not read. */
    public static final String INVALID_SIGNATURE_FILE = "invalid-signature-file";

    public SignatureException(String code, String message) {
        super(code, message);
    }

    public SignatureException(String code, String message, Throwable cause) {
        super(code, message, cause);
    }
}
