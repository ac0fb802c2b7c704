package dev.pressmark.server;

import io.javalin.http.Handler;
import java.util.List;
import java.util.concurrent.Semaphore;

/**
 * Bounds how many model requests run at once. Beyond the bound a request is answered at once
 * with 503 and {@code Retry-After} instead of waiting in the thread pool's queue, so that a burst
 * costs its senders a retry rather than every caller a slow answer, and the endpoints outside the
 * bound (health, metrics, docs) keep answering for the load balancer and the operator: the pool
 * has threads beyond the bound for them ({@link PressmarkServer}). When the request ends, its
 * body's share of the {@link BodyBudget} goes back.
 */
final class Admission {

    static final String RETRY_AFTER_SECONDS = "1";
    /** The problem type of a request that ran out of heap. */
    static final String OUT_OF_MEMORY = "out-of-memory";

    private final int limit;
    private final Semaphore permits;
    private final Bodies bodies;

    Admission(int limit, Bodies bodies) {
        if (limit < 1) {
            throw new IllegalArgumentException("limit must be >= 1, was " + limit);
        }
        this.limit = limit;
        this.permits = new Semaphore(limit);
        this.bodies = bodies;
    }

    /** {@code handler}, run only while a permit is free. */
    Handler bounded(Handler handler) {
        Handler guarded = guarded(handler);
        return ctx -> {
            if (!permits.tryAcquire()) {
                throw new ApiProblem(503, "busy", "Too many requests in progress", "the server is serving its limit of " + limit
                        + " model requests at once; retry after " + RETRY_AFTER_SECONDS + " s", List.of())
                        .withHeader("Retry-After", RETRY_AFTER_SECONDS);
            }
            try {
                guarded.handle(ctx);
            } finally {
                bodies.release(ctx);
                permits.release();
            }
        };
    }

    /**
     * {@code handler}, with a virtual machine error of the request's own making (the heap running
     * out, a stack overflow) answered as a problem detail: the framework would answer it with an
     * empty 500. The error unwinds the request, whose memory then comes free.
     */
    static Handler guarded(Handler handler) {
        return ctx -> {
            try {
                handler.handle(ctx);
            } catch (OutOfMemoryError e) {
                throw new ApiProblem(503, OUT_OF_MEMORY, "Server out of memory", "the server ran out of memory for this request; retry after "
                        + RETRY_AFTER_SECONDS + " s, or send fewer items", List.of()).withHeader("Retry-After", RETRY_AFTER_SECONDS).causedBy(e);
            } catch (StackOverflowError e) {
                throw new ApiProblem(500, "internal", "Internal error", "the request failed; the server log has the details", List.of()).causedBy(e);
            }
        };
    }
}
