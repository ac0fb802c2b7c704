/**
 * The HTTP service: live models, predict and explain, admin endpoints.
 */
package dev.pressmark.server;
