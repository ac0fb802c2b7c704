/**
 * Linear classifiers and their solvers.
 */
package dev.pressmark.core.classify;
