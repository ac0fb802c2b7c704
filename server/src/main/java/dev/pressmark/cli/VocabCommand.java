package dev.pressmark.cli;

import picocli.CommandLine.Command;

/** {@code pressmark vocab}: learn a WordPiece vocabulary alone, or encode text with one. */
@Command(
        name = "vocab",
        mixinStandardHelpOptions = true,
        description = "Learn a WordPiece vocabulary, or encode text with one.",
        subcommands = {VocabTrainCommand.class, VocabEncodeCommand.class})
final class VocabCommand {
}
