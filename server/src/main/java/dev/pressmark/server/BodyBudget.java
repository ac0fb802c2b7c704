package dev.pressmark.server;

import java.util.List;
import java.util.concurrent.atomic.AtomicLong;

/**
 * The bytes of request bodies that may be held in memory at once, across every request. A body
 * reserves its size before it is read (a body of unknown length reserves as it grows) and gives
 * it back when its request ends. A body that could never fit is refused with 413; one that does
 * not fit now, with 503 and {@code Retry-After}, before a byte of it is read. One counter, no lock.
 */
final class BodyBudget {

    /** The problem type of a body refused because the budget is spent now. */
    static final String SPENT = "memory-busy";
    static final String RETRY_AFTER_SECONDS = "1";

    private final long capacityBytes;
    private final AtomicLong inUse = new AtomicLong();

    BodyBudget(long capacityBytes) {
        if (capacityBytes < 1) {
            throw new IllegalArgumentException("capacityBytes must be >= 1 byte, was " + capacityBytes);
        }
        this.capacityBytes = capacityBytes;
    }

    long capacityBytes() {
        return capacityBytes;
    }

    /** Bytes reserved now. */
    long inUse() {
        return inUse.get();
    }

    /** Reserves {@code bytes} more, or refuses the request; the caller gives them back with {@link #release}. */
    void reserve(long bytes) {
        if (bytes > capacityBytes) {
            throw ApiProblem.tooLarge("the body needs " + bytes + " bytes, more than the " + capacityBytes
                    + " bytes this server holds for request bodies at once (a share of its heap)");
        }
        while (true) {
            long used = inUse.get();
            if (used + bytes > capacityBytes) {
                throw new ApiProblem(503, SPENT, "Too much request data in progress", "the server holds " + used + " of at most " + capacityBytes
                        + " bytes of request bodies now; retry after " + RETRY_AFTER_SECONDS + " s", List.of())
                        .withHeader("Retry-After", RETRY_AFTER_SECONDS);
            }
            if (inUse.compareAndSet(used, used + bytes)) {
                return;
            }
        }
    }

    void release(long bytes) {
        inUse.addAndGet(-bytes);
    }
}
