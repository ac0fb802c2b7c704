/**
 * The HTTP service: models held live behind atomic references and swapped as the store's change
 * feed reports activations, predict and explain, metadata and admin endpoints, bearer-token
 * access, one mapping of every failure to an RFC 9457 problem detail, Prometheus metrics and a
 * one-line-per-request access log.
 */
package dev.pressmark.server;
