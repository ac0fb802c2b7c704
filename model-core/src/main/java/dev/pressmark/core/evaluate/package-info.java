/**
 * Resampling (stratified splits and folds) and classification metrics.
 */
package dev.pressmark.core.evaluate;
