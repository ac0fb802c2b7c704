package dev.pressmark.server;

import java.util.List;

/**
 * The time a model request may take, from its handler's start (so reading the body counts), checked
 * between pieces of work: after the body is read and between batches of items. The work is not
 * interrupted in the middle of a batch, so a request overruns by at most one batch's time; then it
 * fails, its admission slot is freed, and the thread goes back to the pool.
 *
 * <p>The answer is 503 Service Unavailable, not 504 Gateway Timeout: 504 says that a gateway did not
 * get a timely answer from the server behind it (RFC 9110, section 15.6.5), while here the server
 * itself gives up on its own work because it cannot finish it in time now (section 15.6.4, "currently
 * unable to handle the request due to a temporary overload"). Nor 408, which is about the client not
 * sending its request in time (section 15.5.9): a body that stops arriving is cut by the connector's
 * idle timeout, which limits the gap between two reads, not the whole request.
 */
final class Deadline {

    /** The problem type of a request that ran past its time. */
    static final String EXCEEDED = "deadline-exceeded";

    private final long timeoutMs;
    private final long startNanos;

    private Deadline(long timeoutMs, long startNanos) {
        this.timeoutMs = timeoutMs;
        this.startNanos = startNanos;
    }

    static Deadline start(long timeoutMs) {
        return new Deadline(timeoutMs, System.nanoTime());
    }

    /** Milliseconds left before the deadline; 0 or less once it has passed. */
    long remainingMs() {
        return timeoutMs - (System.nanoTime() - startNanos) / 1_000_000;
    }

    /** Fails the request when its time is up. */
    void check() {
        long elapsedNanos = System.nanoTime() - startNanos;
        if (elapsedNanos > timeoutMs * 1_000_000) {
            throw new ApiProblem(503, EXCEEDED, "Request took too long", "the request ran for " + elapsedNanos / 1_000_000
                    + " ms, past the server's limit of " + timeoutMs + " ms (--request-timeout-ms); send fewer items per request", List.of());
        }
    }
}
