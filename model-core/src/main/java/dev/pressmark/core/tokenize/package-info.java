/**
 * Tokenizers that turn normalised words into tokens: whole words, or WordPiece subwords from a
 * vocabulary that {@link dev.pressmark.core.tokenize.WordPieceTrainer} learns from a corpus.
 */
package dev.pressmark.core.tokenize;
