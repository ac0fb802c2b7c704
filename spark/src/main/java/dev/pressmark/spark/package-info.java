/**
 * Batch scoring of Spark DataFrames with a pressmark bundle. The bundle is read and verified once
 * on the driver, shipped to the executors as one broadcast of its bytes, and loaded once per
 * executor JVM; every row is scored by the same {@code Bundle.predict} the HTTP service calls.
 */
package dev.pressmark.spark;
