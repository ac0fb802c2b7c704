/**
 * The bundle file: preprocessing and weights frozen together, with checksums. {@link
 * dev.pressmark.core.bundle.BundleArchive} writes and verifies the container (a ZIP with a fixed
 * layout and a manifest of per-entry SHA-256 digests); the training code defines the entries.
 */
package dev.pressmark.core.bundle;
