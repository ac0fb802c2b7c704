package dev.pressmark.core.drift;

import dev.pressmark.core.bundle.Bundle;
import java.util.List;
import java.util.Map;
import java.util.Objects;

/**
 * A {@link DriftWindow} over one bundle's live items: tokenises them with the bundle's own
 * pipeline, so that live tokens are counted exactly as the training ones were. Thread-safe as the
 * window is: one thread observes while others report.
 */
public final class DriftMonitor {

    private final Bundle bundle;
    private final DriftWindow window;

    /** @throws DriftException when the bundle's profile cannot be used */
    public DriftMonitor(Bundle bundle, int capacity) {
        this.bundle = Objects.requireNonNull(bundle, "bundle");
        this.window = new DriftWindow(DriftProfile.of(bundle), bundle.inputFields(), capacity);
    }

    public Bundle bundle() {
        return bundle;
    }

    /** Adds {@code items}, each mapping every input field of the bundle to its text. */
    public void observe(List<Map<String, String>> items) {
        for (List<List<String>> row : bundle.tokenize(items)) {
            window.add(row, bundle.pipeline().unknownTokens(row));
        }
    }

    public DriftReport report() {
        return window.report();
    }
}
