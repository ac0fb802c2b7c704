package dev.pressmark.server;

import io.javalin.http.Context;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.InputStream;
import java.util.List;
import java.util.concurrent.TimeoutException;
import org.eclipse.jetty.server.HttpChannel;
import org.eclipse.jetty.server.Request;

/**
 * Reads request bodies within three bounds: size (413), the {@link BodyBudget} of bytes held at
 * once (413 or 503 before reading), and time. A body must keep arriving: after a grace of
 * {@value #GRACE_MS} ms every byte read buys {@code 1 / }{@value #MIN_BYTES_PER_SECOND} of a second
 * more. A body that falls behind is answered 408 {@value #TOO_SLOW} and its connection closed; a
 * predict or explain whose deadline passes while its body arrives, 503 as any request past its
 * deadline. While a read waits for bytes, the connection's idle timeout is shortened to the time
 * the body has left, so a sender that goes quiet is cut then rather than after the connector's 30 s.
 */
final class Bodies {

    /** Long enough for any client to start sending on a slow link; short against a sender that trickles. */
    static final long GRACE_MS = 5_000;
    /** Far below any real link (a 56 kbit/s modem moves 7 KiB/s), far above one byte every few seconds. */
    static final long MIN_BYTES_PER_SECOND = 1_024;
    /** The problem type of a body that arrived too slowly. */
    static final String TOO_SLOW = "body-too-slow";
    /** How much a body of unknown length reserves at a time. */
    static final int CHUNKED_STEP_BYTES = 64 * 1024;

    private static final String RESERVED = "pressmark.body-reserved";
    private static final long NANOS_PER_BYTE = 1_000_000_000L / MIN_BYTES_PER_SECOND;

    private final BodyBudget budget;

    Bodies(BodyBudget budget) {
        this.budget = budget;
    }

    /** Gives back what the request's body reserved; called once its handler has finished. */
    void release(Context ctx) {
        if (ctx.attribute(RESERVED) instanceof Long reserved) {
            budget.release(reserved);
            ctx.attribute(RESERVED, null);
        }
    }

    /** Reads the body, stopping as soon as it passes {@code limitBytes}, whether or not a length was declared. */
    byte[] read(Context ctx, long limitBytes, Deadline deadline) {
        long declared = ctx.req().getContentLengthLong();
        if (declared > limitBytes) {
            throw tooLarge(limitBytes, declared + " bytes");
        }
        reserve(ctx, declared >= 0 ? declared : Math.min(limitBytes, CHUNKED_STEP_BYTES));
        Clock clock = new Clock(ctx, deadline);
        try (InputStream in = ctx.req().getInputStream()) {
            return declared >= 0 ? exactly(in, (int) declared, clock) : untilEnd(ctx, in, limitBytes, clock);
        } catch (IOException e) {
            if (e.getCause() instanceof TimeoutException) {
                throw clock.timedOut(ctx);
            }
            // The client stopped sending (or closed) before the body was complete: its fault, not the server's.
            throw new ApiProblem(400, "incomplete-body", "Incomplete body", "the body ended before it was complete"
                    + (declared >= 0 ? " (" + declared + " bytes were declared)" : ""), List.of());
        } finally {
            clock.restore();
        }
    }

    /** The usual case: exactly the declared bytes into their own array, with no copying buffer. */
    private byte[] exactly(InputStream in, int declared, Clock clock) throws IOException {
        byte[] body = new byte[declared];
        int read = 0;
        while (read < declared) {
            clock.beforeRead(in, read);
            int n = in.read(body, read, declared - read);
            if (n < 0) {
                throw new IOException("the body ended after " + read + " of " + declared + " bytes");
            }
            read += n;
        }
        return body;
    }

    private byte[] untilEnd(Context ctx, InputStream in, long limitBytes, Clock clock) throws IOException {
        ByteArrayOutputStream out = new ByteArrayOutputStream(8192);
        byte[] buffer = new byte[16 * 1024];
        long total = 0;
        while (true) {
            clock.beforeRead(in, total);
            int n = in.read(buffer);
            if (n < 0) {
                return out.toByteArray();
            }
            total += n;
            if (total > limitBytes) {
                throw tooLarge(limitBytes, "more");
            }
            long reserved = ctx.attribute(RESERVED) instanceof Long r ? r : 0;
            if (total > reserved) {
                reserve(ctx, Math.min(limitBytes, Math.max(total, reserved * 2)) - reserved);
            }
            out.write(buffer, 0, n);
        }
    }

    private void reserve(Context ctx, long bytes) {
        budget.reserve(bytes);
        long before = ctx.attribute(RESERVED) instanceof Long r ? r : 0;
        ctx.attribute(RESERVED, before + bytes);
    }

    /** The time a body has: the grace plus what its bytes so far bought; and the request's deadline, if it has one. */
    private static final class Clock {
        private final long startNanos = System.nanoTime();
        private final Deadline deadline;
        private final HttpChannel channel;
        private final long connectorIdleMs;
        private long received;
        private boolean shortened;

        Clock(Context ctx, Deadline deadline) {
            this.deadline = deadline;
            Request base = Request.getBaseRequest(ctx.req());
            this.channel = base == null ? null : base.getHttpChannel();
            this.connectorIdleMs = channel == null ? 0 : channel.getIdleTimeout();
        }

        /**
         * Fails the request when the body is behind its rate (408) or the request past its deadline
         * (503); else, if the next read may wait, lets it wait only as long as the body has left.
         */
        void beforeRead(InputStream in, long receivedSoFar) throws IOException {
            received = receivedSoFar;
            long leftMs = byRateMs();
            if (leftMs <= 0) {
                throw new IOException("the body is behind its minimum rate", new TimeoutException());
            }
            if (deadline != null) {
                deadline.check();
                leftMs = Math.min(leftMs, Math.max(1, deadline.remainingMs()));
            }
            if (channel != null && connectorIdleMs > 0 && leftMs < connectorIdleMs && in.available() == 0) {
                channel.setIdleTimeout(leftMs);
                shortened = true;
            }
        }

        /** What a read that timed out means: the request's deadline passed (503), else the body was too slow. */
        ApiProblem timedOut(Context ctx) {
            if (deadline != null && byRateMs() > 0) {
                deadline.check();
            }
            return tooSlow(ctx, this);
        }

        private long byRateMs() {
            return (GRACE_MS * 1_000_000 + received * NANOS_PER_BYTE - (System.nanoTime() - startNanos)) / 1_000_000;
        }

        long elapsedMs() {
            return (System.nanoTime() - startNanos) / 1_000_000;
        }

        void restore() {
            if (shortened) {
                channel.setIdleTimeout(connectorIdleMs);
            }
        }
    }

    private static ApiProblem tooSlow(Context ctx, Clock clock) {
        // Whatever is still on its way is not read: the connection cannot carry another request.
        ctx.header("Connection", "close");
        return new ApiProblem(408, TOO_SLOW, "Request body too slow", "the body was not complete after " + clock.elapsedMs()
                + " ms: a body must start within " + GRACE_MS + " ms and then arrive at " + MIN_BYTES_PER_SECOND
                + " bytes per second or more", List.of());
    }

    static ApiProblem tooLarge(long limitBytes, String had) {
        String mib = limitBytes >= 1L << 20 ? " (" + (limitBytes >> 20) + " MiB)" : "";
        return ApiProblem.tooLarge("the body may have at most " + limitBytes + " bytes" + mib + ", had " + had);
    }
}
