package dev.pressmark.core.feature;

import java.util.Arrays;
import java.util.Objects;
import java.util.function.ToIntFunction;

/**
 * Caps on the number of features of each view of the text, beside {@code features.max_tokens}
 * over all of them.
 *
 * @param viewOf the view of a token, in {@code [0, caps.length)}
 * @param caps the most features each view may keep; {@link FeatureConfig#ALL} for no cap
 */
public record ViewCaps(ToIntFunction<String> viewOf, int[] caps) {

    /** One view, no cap of its own. */
    public static final ViewCaps NONE = new ViewCaps(token -> 0, new int[] {FeatureConfig.ALL});

    public ViewCaps {
        Objects.requireNonNull(viewOf, "viewOf");
        caps = caps.clone();
        for (int v = 0; v < caps.length; v++) {
            if (caps[v] < 1) {
                throw new IllegalArgumentException("max_tokens of view " + v + " must be >= 1, was " + caps[v]);
            }
        }
    }

    @Override
    public int[] caps() {
        return caps.clone();
    }

    @Override
    public boolean equals(Object other) {
        return other instanceof ViewCaps that && viewOf.equals(that.viewOf) && Arrays.equals(caps, that.caps);
    }

    @Override
    public int hashCode() {
        return 31 * viewOf.hashCode() + Arrays.hashCode(caps);
    }

    @Override
    public String toString() {
        return "ViewCaps" + Arrays.toString(caps);
    }
}
