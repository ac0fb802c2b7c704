/**
 * The bundle file: preprocessing and weights frozen together, with checksums.
 */
package dev.pressmark.core.bundle;
