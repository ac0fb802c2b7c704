/**
 * Resampling and classification metrics. {@link dev.pressmark.core.evaluate.Resampling} draws
 * stratified train/test splits and repeated stratified folds from a seed, by row or by whole
 * groups of rows; {@link dev.pressmark.core.evaluate.Evaluation} turns truth, predictions, scores
 * and optional case weights into a confusion matrix and the metrics of
 * {@link dev.pressmark.core.evaluate.Metric}; {@link dev.pressmark.core.evaluate.FoldSummary}
 * condenses the folds into a mean and a standard error per metric.
 */
package dev.pressmark.core.evaluate;
