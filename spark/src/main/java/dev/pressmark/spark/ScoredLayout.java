package dev.pressmark.spark;

import dev.pressmark.core.bundle.ScoredRows;
import java.io.Serializable;

/**
 * What {@link PartitionScorer} appends to each input row: the prediction of one row of a scored
 * batch, as one struct column or as flat columns. Made on the driver and shipped with the task.
 */
interface ScoredLayout extends Serializable {

    /** How many values each row gets. */
    int width();

    /**
     * Writes row {@code k} of {@code scored} into {@code values} from index {@code at} on; leaves
     * the nulls there when {@code k} is -1 (a row with a null text, which is not scored).
     */
    void append(Object[] values, int at, ScoredRows scored, int k);
}
