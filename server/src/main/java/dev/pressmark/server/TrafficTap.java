package dev.pressmark.server;

import dev.pressmark.core.bundle.Bundle;
import dev.pressmark.core.bundle.Prediction;
import java.util.List;
import java.util.Map;
import java.util.concurrent.ArrayBlockingQueue;
import java.util.concurrent.CopyOnWriteArrayList;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicLong;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

/**
 * Hands answered predict requests to listeners off the request path: {@link #offer} puts them on a
 * bounded queue and returns at once, and one daemon thread passes each to every listener in turn.
 * When the queue is full the request is dropped and counted, never waited for, so a slow listener
 * costs samples, not latency.
 */
final class TrafficTap implements AutoCloseable {

    /** Told of each answered request, on the tap's thread. */
    interface Listener {
        void onPredict(String model, String tag, Bundle served, List<Map<String, String>> items, List<Prediction> results);
    }

    private record Tapped(String model, String tag, Bundle served, List<Map<String, String>> items, List<Prediction> results) {
    }

    private static final Logger LOG = LoggerFactory.getLogger(TrafficTap.class);
    private static final long POLL_MS = 200;

    private final ArrayBlockingQueue<Tapped> queue;
    private final Metrics metrics;
    private final List<Listener> listeners = new CopyOnWriteArrayList<>();
    private final AtomicLong dropped = new AtomicLong();
    private final Thread worker;
    private volatile boolean closed;

    TrafficTap(int capacity, Metrics metrics) {
        if (capacity < 1) {
            throw new IllegalArgumentException("capacity must be >= 1 request, was " + capacity);
        }
        this.queue = new ArrayBlockingQueue<>(capacity);
        this.metrics = metrics;
        this.worker = new Thread(this::run, "pressmark-traffic-tap");
        this.worker.setDaemon(true);
        this.worker.start();
    }

    void register(Listener listener) {
        listeners.add(listener);
    }

    /** Queues one answered request; false, and counted, when the queue is full or the tap closed. Never blocks. */
    boolean offer(String model, String tag, Bundle served, List<Map<String, String>> items, List<Prediction> results) {
        if (!closed && queue.offer(new Tapped(model, tag, served, items, results))) {
            return true;
        }
        dropped.incrementAndGet();
        metrics.tapDropped();
        return false;
    }

    /** Requests dropped because the queue was full. */
    long dropped() {
        return dropped.get();
    }

    private void run() {
        while (!closed) {
            Tapped tapped;
            try {
                tapped = queue.poll(POLL_MS, TimeUnit.MILLISECONDS);
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
                return;
            }
            if (tapped == null) {
                continue;
            }
            for (Listener listener : listeners) {
                try {
                    listener.onPredict(tapped.model(), tapped.tag(), tapped.served(), tapped.items(), tapped.results());
                } catch (RuntimeException e) {
                    // One listener's failure must not stop the others or the tap; the request itself was answered long ago.
                    LOG.warn("traffic listener {} failed on {} {}: {}", listener.getClass().getSimpleName(), tapped.model(), tapped.tag(), e.toString());
                }
            }
        }
    }

    @Override
    public void close() {
        closed = true;
        worker.interrupt();
        try {
            worker.join(POLL_MS * 10);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        }
    }
}
