/**
 * The {@code pressmark} command line: one picocli subcommand per job, exit codes 0 ok,
 * 1 a failure the user can fix, 2 a usage error.
 */
package dev.pressmark.cli;
