package dev.pressmark.cli;

import java.io.IOException;
import java.io.PrintStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.text.DecimalFormat;
import java.text.DecimalFormatSymbols;
import java.time.temporal.ChronoUnit;
import java.util.Locale;
import me.tongfei.progressbar.ConsoleProgressBarConsumer;
import me.tongfei.progressbar.ProgressBar;
import me.tongfei.progressbar.ProgressBarBuilder;
import me.tongfei.progressbar.ProgressBarStyle;

/**
 * Progress of {@code predict} on stderr: on a terminal a redrawn bar of rows with rows per second,
 * its length estimated from the bytes of the file read so far; otherwise nothing until the end.
 * Either way a closing line gives the rows, the time and the rate.
 */
final class RowProgress implements BatchScorer.Progress, AutoCloseable {

    private final PrintStream err;
    private final long fileBytes;
    private final ProgressBar bar;
    private final long startedNanos = System.nanoTime();
    private long rows;
    private boolean closed;

    /** {@code fileBytes}: the input's size, 0 when unknown; {@code terminal}: whether to draw a bar. */
    RowProgress(PrintStream err, long fileBytes, boolean terminal) {
        this.err = err;
        this.fileBytes = fileBytes;
        this.bar = terminal ? new ProgressBarBuilder()
                .setTaskName("predict")
                .setInitialMax(-1)
                .setStyle(ProgressBarStyle.ASCII)
                .setConsumer(new ConsoleProgressBarConsumer(err))
                .setUnit(" rows", 1)
                .showSpeed(new DecimalFormat("#,##0", DecimalFormatSymbols.getInstance(Locale.ROOT)))
                .setSpeedUnit(ChronoUnit.SECONDS)
                .setUpdateIntervalMillis(250)
                .continuousUpdate()
                .build() : null;
    }

    @Override
    public void rowsWritten(long newRows, long bytesRead) {
        rows = newRows;
        if (bar == null) {
            return;
        }
        if (fileBytes > 0 && bytesRead > 0) {
            bar.maxHint(Math.max(newRows, Math.round((double) newRows * fileBytes / bytesRead)));
        }
        bar.stepTo(newRows);
    }

    /** Ends the bar and prints the closing line, with {@code note} (such as the bad rows left out) when not empty. */
    void finish(String note) {
        close();
        double seconds = (System.nanoTime() - startedNanos) / 1e9;
        err.printf(Locale.ROOT, "pressmark: predict: %,d rows in %.1f s (%,.0f rows/s)%s%n", rows, seconds,
                seconds > 0 ? rows / seconds : 0.0, note.isEmpty() ? "" : "; " + note);
    }

    @Override
    public void close() {
        if (bar != null && !closed) {
            bar.close();
        }
        closed = true;
    }

    /**
     * Whether stderr is a terminal. The JDK answers only for stdin and stdout together, and the
     * usual batch run sends stdout to a file; on Linux, /proc says where stderr goes.
     */
    static boolean stderrIsTerminal() {
        try {
            String target = Files.readSymbolicLink(Path.of("/proc/self/fd/2")).toString();
            return target.startsWith("/dev/pts/") || target.startsWith("/dev/tty");
        } catch (IOException | UnsupportedOperationException | SecurityException e) {
            return System.console() != null;
        }
    }
}
