package dev.pressmark.cli;

import dev.pressmark.core.Progress;
import java.io.PrintStream;
import java.util.Locale;
import me.tongfei.progressbar.ConsoleProgressBarConsumer;
import me.tongfei.progressbar.ProgressBar;
import me.tongfei.progressbar.ProgressBarBuilder;
import me.tongfei.progressbar.ProgressBarStyle;

/**
 * Shows progress on stderr: a redrawn bar on a terminal, one line per finished task otherwise
 * (a log file should not fill with redrawn bars). Notes (warnings) are plain lines either way.
 */
final class ConsoleProgress implements Progress {

    private final PrintStream err;
    private final boolean terminal;
    private ProgressBar bar;
    private String task;
    private long total;
    private long done;
    private long startedNanos;

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
        }
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
