/**
 * The bundle file: preprocessing and weights frozen together, with checksums. {@link
 * dev.pressmark.core.bundle.BundleArchive} writes and verifies the container (a ZIP with a fixed
 * layout and a manifest of per-entry SHA-256 digests); {@link dev.pressmark.core.bundle.Manifest}
 * is the one reader and writer of the manifest's fields, and {@link dev.pressmark.core.bundle.Bundle}
 * writes the entries and loads them into a model.
 */
package dev.pressmark.core.bundle;
