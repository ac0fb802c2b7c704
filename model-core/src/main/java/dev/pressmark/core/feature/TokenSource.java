package dev.pressmark.core.feature;

/**
 * Rows of text as the views of a pipeline see them, one field of one row at a time, so that a
 * feature space can be fitted and rows transformed without holding a string per token: only
 * distinct tokens ever become strings.
 */
public interface TokenSource {

    /** The number of rows. */
    int rows();

    /** Hands every token of text column {@code column} of row {@code row} to {@code sink}, view by view. */
    void scan(int row, int column, Sink sink);

    /** Receives one token of one view as a span of characters, valid only during the call. */
    @FunctionalInterface
    interface Sink {

        void token(int view, CharSequence chars, int start, int end);
    }
}
