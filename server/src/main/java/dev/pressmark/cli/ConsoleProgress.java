package dev.pressmark.cli;

import dev.pressmark.core.Progress;
import java.io.PrintStream;
import java.util.Locale;
import me.tongfei.progressbar.ConsoleProgressBarConsumer;
import me.tongfei.progressbar.ProgressBar;
import me.tongfei.progressbar.ProgressBarBuilder;
import me.tongfei.progressbar.ProgressBarStyle;

/**
 * Shows progress on stderr: a redrawn bar with the elapsed time and an estimate of the time left on
 * a terminal; otherwise (a log file should not fill with redrawn bars) one line per finished task,
 * and for a long task a line at most every {@value #LOG_INTERVAL_SECONDS} s with the time left.
 * The estimate is linear: the time per step so far times the steps to go. Notes (warnings) are
 * plain lines either way.
 */
final class ConsoleProgress implements Progress {

    /** The least time between two progress lines when stderr is not a terminal. */
    static final int LOG_INTERVAL_SECONDS = 10;

    private final PrintStream err;
    private final boolean terminal;
    private ProgressBar bar;
    private String task;
    private long total;
    private long done;
    private long startedNanos;
    private long loggedNanos;

    ConsoleProgress(PrintStream err) {
        this(err, System.console() != null);
    }

    ConsoleProgress(PrintStream err, boolean terminal) {
        this.err = err;
        this.terminal = terminal;
    }

    @Override
    public void start(String newTask, long newTotal) {
        finish();
        task = newTask;
        total = newTotal;
        done = 0;
        startedNanos = System.nanoTime();
        loggedNanos = startedNanos;
        if (terminal) {
            bar = new ProgressBarBuilder()
                    .setTaskName(newTask)
                    .setInitialMax(newTotal)
                    .setStyle(ProgressBarStyle.ASCII)
                    .setConsumer(new ConsoleProgressBarConsumer(err))
                    .setUpdateIntervalMillis(250)
                    .continuousUpdate()
                    .build();
        }
    }

    @Override
    public void advance(long newDone) {
        done = newDone;
        if (bar != null) {
            bar.stepTo(newDone);
            return;
        }
        long now = System.nanoTime();
        if (task != null && total > 0 && newDone < total && now - loggedNanos >= LOG_INTERVAL_SECONDS * 1_000_000_000L) {
            loggedNanos = now;
            err.printf(Locale.ROOT, "pressmark: %s: %d of %d done, about %s left%n", task, newDone, total,
                    duration(secondsLeft(newDone, total, now - startedNanos)));
        }
    }

    /** The linear estimate of the seconds left: the time per step so far times the steps to go; -1 before the first step. */
    static double secondsLeft(long done, long total, long elapsedNanos) {
        if (done <= 0) {
            return -1;
        }
        return elapsedNanos / 1e9 / done * (total - done);
    }

    /** {@code 42 s}, {@code 3 min 5 s}, {@code 1 h 2 min}; "unknown" for a negative count. */
    static String duration(double seconds) {
        if (seconds < 0) {
            return "an unknown time";
        }
        long s = Math.round(seconds);
        if (s < 60) {
            return s + " s";
        }
        if (s < 3600) {
            return s / 60 + " min " + s % 60 + " s";
        }
        return s / 3600 + " h " + s % 3600 / 60 + " min";
    }

    @Override
    public void finish() {
        if (bar != null) {
            bar.close();
            bar = null;
        } else if (task != null) {
            err.printf(Locale.ROOT, "pressmark: %s: %d of %d done in %.1f s%n", task, done, total, (System.nanoTime() - startedNanos) / 1e9);
        }
        task = null;
    }

    @Override
    public void note(String message) {
        finish();
        err.println("pressmark: " + message);
    }
}
