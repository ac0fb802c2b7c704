package dev.pressmark.server;

import io.javalin.http.Handler;
import java.util.List;
import java.util.concurrent.Semaphore;

/**
 * Bounds how many model requests run at once. Beyond the bound a request is answered at once
 * with 503 and {@code Retry-After} instead of waiting in the thread pool's queue, so that a burst
 * costs its senders a retry rather than every caller a slow answer, and the endpoints outside the
 * bound (health, metrics, docs) keep answering for the load balancer and the operator.
 */
final class Admission {

    static final String RETRY_AFTER_SECONDS = "1";

    private final int limit;
    private final Semaphore permits;

    Admission(int limit) {
        if (limit < 1) {
            throw new IllegalArgumentException("limit must be >= 1, was " + limit);
        }
        this.limit = limit;
        this.permits = new Semaphore(limit);
    }

    /** {@code handler}, run only while a permit is free. */
    Handler bounded(Handler handler) {
        return ctx -> {
            if (!permits.tryAcquire()) {
                ctx.header("Retry-After", RETRY_AFTER_SECONDS);
                throw new ApiProblem(503, "busy", "Too many requests in progress", "the server is serving its limit of " + limit
                        + " model requests at once; retry after " + RETRY_AFTER_SECONDS + " s", List.of());
            }
            try {
                handler.handle(ctx);
            } finally {
                permits.release();
            }
        };
    }
}
