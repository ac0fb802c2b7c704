/**
 * Linear classifiers over {@link dev.pressmark.core.feature.SparseMatrix} rows: an L2-regularised
 * linear SVM and logistic regression, each solved by dual coordinate descent, one versus rest for
 * more than two classes, class weights, and Platt-scaled probabilities. Classes are the ints
 * {@code 0 .. K - 1}; mapping them to label strings is the caller's job.
 */
package dev.pressmark.core.classify;
