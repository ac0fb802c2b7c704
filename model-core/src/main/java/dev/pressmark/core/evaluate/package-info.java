/**
 * Resampling and classification metrics. {@link dev.pressmark.core.evaluate.Resampling} draws
 * stratified train/test splits and repeated stratified folds from a seed;
 * {@link dev.pressmark.core.evaluate.Evaluation} turns truth, predictions and scores into a
 * confusion matrix and the metrics of {@link dev.pressmark.core.evaluate.Metric};
 * {@link dev.pressmark.core.evaluate.FoldSummary} condenses the folds into a mean and a standard
 * error per metric.
 */
package dev.pressmark.core.evaluate;
