package dev.pressmark.cli;

import dev.pressmark.core.Progress;
import java.io.PrintStream;
import me.tongfei.progressbar.ConsoleProgressBarConsumer;
import me.tongfei.progressbar.ProgressBar;
import me.tongfei.progressbar.ProgressBarBuilder;
import me.tongfei.progressbar.ProgressBarStyle;

/** Draws progress as a bar on stderr; notes (warnings) go to stderr as plain lines. */
final class ConsoleProgress implements Progress {

    private final PrintStream err;
    private ProgressBar bar;

    ConsoleProgress(PrintStream err) {
        this.err = err;
    }

    @Override
    public void start(String task, long total) {
        finish();
        bar = new ProgressBarBuilder()
                .setTaskName(task)
                .setInitialMax(total)
                .setStyle(ProgressBarStyle.ASCII)
                .setConsumer(new ConsoleProgressBarConsumer(err))
                .setUpdateIntervalMillis(250)
                .continuousUpdate()
                .build();
    }

    @Override
    public void advance(long done) {
        if (bar != null) {
            bar.stepTo(done);
        }
    }

    @Override
    public void finish() {
        if (bar != null) {
            bar.close();
            bar = null;
        }
    }

    @Override
    public void note(String message) {
        finish();
        err.println("pressmark: " + message);
    }
}
