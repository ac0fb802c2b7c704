/**
 * Turns token lists into sparse feature rows: token selection, weighting and scaling, and the
 * immutable CSR {@link dev.pressmark.core.feature.SparseMatrix} that the classifiers read.
 */
package dev.pressmark.core.feature;
