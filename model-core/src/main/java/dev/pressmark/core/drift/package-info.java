/**
 * How far live traffic has moved from the rows a model was trained on. {@link
 * dev.pressmark.core.drift.DriftProfile} reads a bundle's training profile; {@link
 * dev.pressmark.core.drift.DriftWindow} keeps the last items served and compares them with it:
 * unknown-token rate, the population stability index over the most frequent tokens ({@link
 * dev.pressmark.core.drift.Psi}) and the shift in tokens per item. A package of its own because it
 * measures traffic, not a classifier's quality, which is what {@code evaluate} does.
 */
package dev.pressmark.core.drift;
