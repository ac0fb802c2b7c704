/**
 * The HTTP service: models held live behind atomic references and swapped as the store's change
 * feed reports activations, predict and explain, metadata and admin endpoints, bearer-token
 * access, and one mapping of every failure to an RFC 9457 problem detail.
 */
package dev.pressmark.server;
