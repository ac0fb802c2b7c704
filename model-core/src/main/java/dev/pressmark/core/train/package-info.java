/**
 * The training configuration and the orchestration from data to bundle.
 */
package dev.pressmark.core.train;
