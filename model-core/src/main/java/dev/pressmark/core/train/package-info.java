/**
 * The training configuration and the orchestration from data to bundle: {@link
 * dev.pressmark.core.train.BundleTrainer#train} is the one call that takes a config and its data and
 * returns the bundle, reporting progress as it goes.
 */
package dev.pressmark.core.train;
