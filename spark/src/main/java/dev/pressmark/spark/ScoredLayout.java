package dev.pressmark.spark;

import dev.pressmark.core.bundle.ScoredRows;
import java.io.Serializable;
import org.apache.spark.sql.Row;

/**
 * How {@link PartitionScorer} lays out each scored row: the input row's values followed by the
 * prediction as one struct column, or the whole row as one CSV line. Made on the driver and
 * shipped with the task.
 */
interface ScoredLayout extends Serializable {

    /**
     * The output row for {@code input}, whose prediction is row {@code k} of {@code scored}, or
     * which has none when {@code k} is -1 (a row with a null text, which is not scored).
     */
    Row row(Row input, ScoredRows scored, int k);

    /** A row each non-empty partition starts with, or null for none. */
    default Row header() {
        return null;
    }
}
