/**
 * The HTTP contract of a model version: the input fields a predict item must carry and the labels
 * an answer can name. Publishing compares a new bundle's contract with the active version's,
 * calls the difference breaking or not, and numbers contracts with semantic versions.
 */
package dev.pressmark.core.contract;
