/**
 * Turns token lists into sparse feature rows: token selection, weighting and scaling.
 */
package dev.pressmark.core.feature;
