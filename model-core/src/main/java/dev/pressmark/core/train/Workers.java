package dev.pressmark.core.train;

import dev.pressmark.core.PressmarkException;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;

/** The daemon thread pools of a training run, and waiting for their work the same way everywhere. */
final class Workers {

    private Workers() {
    }

    /** A pool of {@code threads} daemon threads named {@code name}. */
    static ExecutorService pool(int threads, String name) {
        return Executors.newFixedThreadPool(threads, runnable -> {
            Thread thread = new Thread(runnable, name);
            thread.setDaemon(true);
            return thread;
        });
    }

    /**
     * The results of {@code futures} in order. A task's unchecked exception is rethrown as it was;
     * an interruption restores the flag and becomes {@code interrupted}, "{@code what} was interrupted".
     */
    static <T> List<T> await(List<Future<T>> futures, String what) {
        try {
            List<T> results = new ArrayList<>(futures.size());
            for (Future<T> future : futures) {
                results.add(future.get());
            }
            return results;
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new PressmarkException("interrupted", what + " was interrupted");
        } catch (ExecutionException e) {
            if (e.getCause() instanceof RuntimeException runtime) {
                throw runtime;
            }
            throw new IllegalStateException(e.getCause());
        }
    }
}
