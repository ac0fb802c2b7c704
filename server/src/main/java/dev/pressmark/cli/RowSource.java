package dev.pressmark.cli;

import java.util.List;

/** Where {@code predict} reads its rows from, a chunk at a time. */
interface RowSource extends AutoCloseable {

    /** The input's columns, which the output repeats before the model's. */
    List<String> columns();

    /** The next at most {@code maxRows} rows, or null at the end. */
    RowChunk next(int maxRows);

    /** Bytes of the input read so far, for progress; 0 when it is not a file. */
    long bytesRead();

    /** Rows left out as bad (see {@code --skip-bad-rows}) so far. */
    BadRows badRows();

    @Override
    void close();
}
