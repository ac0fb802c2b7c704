/**
 * The invented-scenario data generator and the demo walk-through.
 */
package dev.pressmark.demo;
