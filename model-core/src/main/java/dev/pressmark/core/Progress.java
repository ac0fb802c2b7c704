package dev.pressmark.core;

/**
 * Receives progress of long work (vocabulary training, folds, the final fit). The command line
 * draws it as a progress bar; library callers may ignore it with {@link #NONE}.
 * Calls come from the working thread; an implementation must be cheap.
 */
public interface Progress {

    /** Ignores all progress. */
    Progress NONE = new Progress() {
        @Override
        public void start(String task, long total) {
        }

        @Override
        public void advance(long done) {
        }

        @Override
        public void finish() {
        }
    };

    /** A new task begins; {@code total} is its number of steps, or -1 when unknown. */
    void start(String task, long total);

    /** {@code done} steps of the current task are complete. */
    void advance(long done);

    /** The current task has ended. */
    void finish();

    /** A note for the user, such as a warning; the default drops it. */
    default void note(String message) {
    }
}
