/**
 * Batch scoring of Spark DataFrames with a pressmark bundle. The bundle is read and verified once
 * on the driver, shipped to the executors as one broadcast of its bytes, and loaded once per
 * executor JVM; each partition is scored a batch of rows at a time by the same {@code Bundle.score}
 * as {@code pressmark predict --data} (the SQL function, a row at a time, by {@code Bundle.predict}).
 */
package dev.pressmark.spark;
