package dev.pressmark.cli;

import dev.pressmark.core.bundle.ScoredRows;

/**
 * How {@code predict} writes its results: a header, then each chunk's rows as bytes (made on the
 * scoring threads, so that formatting numbers runs in parallel too), then a footer. Stateless
 * after construction, so one instance serves every thread.
 */
interface RowFormat {

    byte[] header();

    /** The bytes of {@code chunk}'s rows, scored into {@code scored}; chunk 0 is the first written. */
    byte[] rows(RowChunk chunk, ScoredRows scored);

    byte[] footer();
}
