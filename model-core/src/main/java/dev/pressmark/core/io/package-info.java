/**
 * File plumbing shared by the other packages: strict UTF-8 line reading with positions in error
 * messages, and writes that leave either the complete new file or nothing.
 */
package dev.pressmark.core.io;
