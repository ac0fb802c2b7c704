package dev.pressmark.cli;

import dev.pressmark.core.Progress;
import dev.pressmark.core.io.Utf8Lines;
import dev.pressmark.core.text.TextNormalizer;
import dev.pressmark.core.tokenize.WordCounts;
import dev.pressmark.core.tokenize.WordPieceTrainer;
import dev.pressmark.core.tokenize.WordPieceVocabulary;
import java.nio.file.Path;
import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;

/** {@code pressmark vocab train}: learn a WordPiece vocabulary from a text file. */
@Command(
        name = "train",
        mixinStandardHelpOptions = true,
        description = {
            "Learn a WordPiece vocabulary from a UTF-8 text file, one document a line.",
            "Writes one token a line, the special tokens first; the file appears only when complete."
        })
final class VocabTrainCommand implements Callable<Integer> {

    @Option(names = "--data", required = true, paramLabel = "FILE", description = "The training text, UTF-8.")
    Path data;

    @Option(names = "--size", required = true, paramLabel = "N", description = "Tokens in the vocabulary, special tokens included.")
    int size;

    @Option(names = "--out", required = true, paramLabel = "FILE", description = "Where to write the vocabulary.")
    Path out;

    @Option(names = "--min-frequency", paramLabel = "K", defaultValue = "" + WordPieceTrainer.Config.DEFAULT_MIN_FREQUENCY,
            description = "The final frequency floor: merge only pairs that occur at least K times (default: ${DEFAULT-VALUE}).")
    long minFrequency;

    @Option(names = "--max-word-chars", paramLabel = "N", defaultValue = "" + WordPieceTrainer.Config.DEFAULT_MAX_WORD_CHARS,
            description = "Ignore words longer than N characters; the encoder makes them [UNK] (default: ${DEFAULT-VALUE}).")
    int maxWordChars;

    @Override
    public Integer call() {
        WordPieceTrainer trainer = new WordPieceTrainer(new WordPieceTrainer.Config(size, minFrequency, maxWordChars));
        Progress progress = new ConsoleProgress(System.err);
        WordCounts counts = new WordCounts(TextNormalizer.DEFAULT);
        long lines = Utf8Lines.forEach(data, (line, number) -> counts.addText(line));
        System.err.printf("pressmark: %s: %,d lines, %,d words, %,d distinct%n", data, lines, counts.totalWords(), counts.distinctWords());
        WordPieceVocabulary vocabulary = trainer.train(counts, progress);
        progress.finish();
        vocabulary.write(out);
        System.err.printf("pressmark: wrote %s (%,d tokens)%n", out, vocabulary.size());
        return Main.EXIT_OK;
    }
}
