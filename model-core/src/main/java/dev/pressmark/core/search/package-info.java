/**
 * Model search: the {@code search} section of a training config, the grid of candidate settings
 * it spans, the candidates' cross-validated scores and the rule that picks one. The training
 * package scores the candidates; this package knows nothing of data or models.
 */
package dev.pressmark.core.search;
