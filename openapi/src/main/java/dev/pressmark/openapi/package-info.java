/**
 * Builds the OpenAPI document of the HTTP service from the live models' descriptors.
 */
package dev.pressmark.openapi;
