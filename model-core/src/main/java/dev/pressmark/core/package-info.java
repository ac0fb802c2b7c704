/**
 * The modelling core of pressmark: everything between a labelled CSV and a frozen bundle.
 * It knows neither JDBC nor HTTP; the store and the server build on it.
 */
package dev.pressmark.core;
