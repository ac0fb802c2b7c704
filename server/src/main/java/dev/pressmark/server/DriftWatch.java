package dev.pressmark.server;

import dev.pressmark.core.bundle.Bundle;
import dev.pressmark.core.bundle.Prediction;
import dev.pressmark.core.drift.DriftMonitor;
import dev.pressmark.core.drift.DriftReport;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.concurrent.ThreadLocalRandom;
import java.util.concurrent.ConcurrentHashMap;

/**
 * Live traffic against each active version's training profile. A share of the predict requests
 * the {@link TrafficTap} passes on goes into one {@link DriftMonitor} per model, kept for the
 * version serving it: when another version becomes active its window starts empty.
 */
final class DriftWatch implements TrafficTap.Listener {

    /** One model's window and the loaded version it measures. */
    private record Watched(Bundle bundle, DriftMonitor monitor) {
    }

    private final LiveModels live;
    private final Metrics metrics;
    private final double sample;
    private final int capacity;
    private final ConcurrentHashMap<String, Watched> windows = new ConcurrentHashMap<>();

    DriftWatch(LiveModels live, Metrics metrics, double sample, int capacity) {
        this.live = live;
        this.metrics = metrics;
        this.sample = sample;
        this.capacity = capacity;
    }

    @Override
    public void onPredict(String model, String tag, Bundle served, List<Map<String, String>> items, List<Prediction> results) {
        // A request queued before a swap was answered by the old version; it says nothing about the new one.
        Optional<LiveVersion> active = live.active(model);
        if (active.isEmpty() || active.get().bundle() != served) {
            return;
        }
        // Only the last items of a batch larger than the window would stay in it; tokenising the rest is wasted.
        window(model, active.get()).observe(items.size() > capacity ? items.subList(items.size() - capacity, items.size()) : items);
    }

    /** The sampling decision, on the request thread before anything is queued: an unsampled request costs one random number. */
    @Override
    public boolean accept(String model) {
        return sample >= 1.0 || (sample > 0.0 && ThreadLocalRandom.current().nextDouble() < sample);
    }

    /** The window of the version now serving {@code model}: empty if that version has seen no traffic yet. */
    DriftReport report(String model, LiveVersion served) {
        return window(model, served).report();
    }

    private DriftMonitor window(String model, LiveVersion served) {
        return windows.compute(model, (m, old) -> {
            if (old != null && old.bundle() == served.bundle()) {
                return old;
            }
            DriftMonitor monitor = new DriftMonitor(served.bundle(), capacity);
            metrics.driftWatched(model, served.tag(), monitor);
            return new Watched(served.bundle(), monitor);
        }).monitor();
    }
}
