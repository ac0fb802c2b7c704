package dev.pressmark.store;

import dev.pressmark.core.bundle.Bundle;
import dev.pressmark.core.bundle.BundleContents;
import dev.pressmark.core.bundle.BundleException;
import dev.pressmark.core.bundle.BundleLimits;

/**
 * The store's one rule for "is this a bundle it may keep or make active": the archive's checksums
 * hold (the reader checks them) and its contents load as a model within {@link BundleLimits#DEFAULT}.
 * Turns the reader's failures into the store's codes.
 */
final class BundleCheck {

    private BundleCheck() {
    }

    /** The store's refusal of bytes the archive reader refused; {@code prefix} (may be empty) goes in front of the message. */
    static StoreException notABundle(BundleException e, String prefix) {
        if (BundleException.TOO_LARGE.equals(e.code())) {
            return new StoreException(StoreException.LIMIT, prefix + e.getMessage(), e);
        }
        String message = e.getMessage().startsWith("not a bundle") ? e.getMessage() : "not a valid bundle: " + e.getMessage();
        return new StoreException(StoreException.NOT_A_BUNDLE, prefix + message, e);
    }

    /**
     * Loads verified contents as a model; a failure is {@link StoreException#LIMIT} or
     * {@link StoreException#UNUSABLE} whose message is {@code what}, the version's name and why.
     */
    static Bundle load(BundleContents contents, String model, String tag, String what) {
        try {
            return Bundle.from(contents, model + " " + tag, BundleLimits.DEFAULT);
        } catch (BundleException e) {
            String code = BundleException.LIMIT.equals(e.code()) ? StoreException.LIMIT : StoreException.UNUSABLE;
            return failed(code, what + e.getMessage(), e);
        } catch (RuntimeException e) {
            // the reader maps what it foresees; anything else from these bytes still means they are no usable model
            return failed(StoreException.UNUSABLE, what + model + " " + tag + ": not a usable model: " + e, e);
        }
    }

    private static Bundle failed(String code, String message, RuntimeException cause) {
        throw new StoreException(code, message, cause);
    }
}
