/**
 * Signed bundles: Ed25519 (RFC 8032) key pairs kept as PEM files, and the small signature file
 * that travels beside a bundle. A signature covers the 32-byte SHA-256 digest of the whole bundle
 * file, the same digest the store records, so a store can check it without reading the bundle twice.
 */
package dev.pressmark.core.sign;
