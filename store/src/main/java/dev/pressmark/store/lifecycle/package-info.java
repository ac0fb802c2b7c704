/**
 * The rules that decide, below both front doors (the command line and the HTTP service): may this
 * bundle be published ({@link dev.pressmark.store.lifecycle.PublishCheck},
 * {@link dev.pressmark.store.lifecycle.SignatureCheck}), may this version become active
 * ({@link dev.pressmark.store.lifecycle.Promotion}, {@link dev.pressmark.store.lifecycle.PromotionCheck}),
 * and what a shadow run found. No JDBC and no JSON views: it works on the facade's values, and each
 * front door renders what it returns.
 */
package dev.pressmark.store.lifecycle;
