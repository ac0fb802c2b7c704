package dev.pressmark.cli;

import dev.pressmark.core.PressmarkException;
import dev.pressmark.core.bundle.Bundle;
import dev.pressmark.core.bundle.ScoredRows;
import java.io.IOException;
import java.io.OutputStream;
import java.util.ArrayDeque;
import java.util.Deque;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import java.util.concurrent.ThreadFactory;
import java.util.concurrent.atomic.AtomicInteger;

/**
 * Scores a {@link RowSource} into an output stream in bounded memory: the calling thread reads a
 * chunk of rows, hands it to one of {@code threads} scoring threads (which also format it), and
 * writes finished chunks in input order. At most {@link #IN_FLIGHT_PER_THREAD} chunks per thread
 * are read ahead, so memory does not grow with the input; the bytes written do not depend on the
 * thread count or the chunk size.
 */
final class BatchScorer {

    /** Rows per chunk: large enough that handing chunks over costs nothing next to scoring them. */
    static final int DEFAULT_CHUNK_ROWS = 2048;
    /** Chunks read ahead per scoring thread: one being scored, one waiting. */
    static final int IN_FLIGHT_PER_THREAD = 2;

    /**
     * @param threads scoring threads, at least 1
     * @param chunkRows rows per chunk, at least 1
     */
    record Settings(int threads, int chunkRows) {
        Settings {
            if (threads < 1) {
                throw new IllegalArgumentException("threads must be >= 1, was " + threads);
            }
            if (chunkRows < 1) {
                throw new IllegalArgumentException("chunkRows must be >= 1 row, was " + chunkRows);
            }
        }
    }

    /** Receives the running row count after each chunk written. */
    @FunctionalInterface
    interface Progress {
        void rowsWritten(long rows, long bytesRead);
    }

    private final Bundle model;
    private final Settings settings;

    BatchScorer(Bundle model, Settings settings) {
        this.model = model;
        this.settings = settings;
    }

    /** Writes every row of {@code source}, scored, to {@code out} in {@code format}; returns the row count. */
    long run(RowSource source, RowFormat format, OutputStream out, Progress progress) throws IOException {
        ExecutorService pool = Executors.newFixedThreadPool(settings.threads(), new ScoringThreads());
        ThreadLocal<ScoredRows> buffers = ThreadLocal.withInitial(
                () -> new ScoredRows(settings.chunkRows(), model.labels().size(), model.hasProbabilities()));
        Deque<Pending> pending = new ArrayDeque<>();
        long rows = 0;
        try {
            out.write(format.header());
            RowChunk chunk;
            while ((chunk = source.next(settings.chunkRows())) != null) {
                RowChunk scored = chunk;
                pending.add(new Pending(pool.submit(() -> score(scored, format, buffers.get())), chunk.size()));
                if (pending.size() >= settings.threads() * IN_FLIGHT_PER_THREAD) {
                    rows += write(pending.poll(), out);
                    progress.rowsWritten(rows, source.bytesRead());
                }
            }
            while (!pending.isEmpty()) {
                rows += write(pending.poll(), out);
            }
            progress.rowsWritten(rows, source.bytesRead());
            out.write(format.footer());
            return rows;
        } finally {
            pool.shutdownNow();
        }
    }

    /** A chunk handed to a scoring thread: its bytes to come, and its row count. */
    private record Pending(Future<byte[]> bytes, int rows) {
    }

    /** Waits for {@code chunk}, writes it and returns its row count. */
    private static int write(Pending chunk, OutputStream out) throws IOException {
        out.write(await(chunk.bytes()));
        return chunk.rows();
    }

    private byte[] score(RowChunk chunk, RowFormat format, ScoredRows buffer) {
        model.score(chunk.inputs(), Bundle.ALL_TOKENS, buffer);
        return format.rows(chunk, buffer);
    }

    private static byte[] await(Future<byte[]> chunk) {
        try {
            return chunk.get();
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new PressmarkException("interrupted", "interrupted while scoring", e);
        } catch (ExecutionException e) {
            if (e.getCause() instanceof RuntimeException r) {
                throw r;
            }
            if (e.getCause() instanceof Error error) {
                throw error;
            }
            throw new PressmarkException("scoring-failed", "scoring failed: " + e.getCause(), e.getCause());
        }
    }

    /** Daemon threads with names that say what they do, in a thread dump. */
    private static final class ScoringThreads implements ThreadFactory {

        private final AtomicInteger count = new AtomicInteger();

        @Override
        public Thread newThread(Runnable task) {
            Thread thread = new Thread(task, "pressmark-score-" + count.incrementAndGet());
            thread.setDaemon(true);
            return thread;
        }
    }
}
