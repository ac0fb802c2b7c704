/**
 * Unicode normalisation and pre-tokenisation. A {@link dev.pressmark.core.text.TextNormalizer} holds
 * the settings that go into a bundle, so that serving applies exactly what training applied.
 */
package dev.pressmark.core.text;
