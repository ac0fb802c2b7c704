/**
 * Turns token lists into sparse feature rows: token selection, weighting and scaling, fitted on the
 * training rows as an immutable {@link dev.pressmark.core.feature.FeatureSpace}, and the immutable
 * CSR {@link dev.pressmark.core.feature.SparseMatrix} that the classifiers read.
 */
package dev.pressmark.core.feature;
