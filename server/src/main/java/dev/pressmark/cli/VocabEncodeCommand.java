package dev.pressmark.cli;

import dev.pressmark.core.io.Utf8Lines;
import dev.pressmark.core.text.TextNormalizer;
import dev.pressmark.core.tokenize.IntList;
import dev.pressmark.core.tokenize.WordPieceEncoder;
import dev.pressmark.core.tokenize.WordPieceVocabulary;
import java.io.BufferedWriter;
import java.io.IOException;
import java.io.OutputStreamWriter;
import java.io.UncheckedIOException;
import java.io.Writer;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;

/**
 * {@code pressmark vocab encode}: one line of standard input becomes one line of space-separated
 * subword tokens on standard output; an empty input line gives an empty output line.
 */
@Command(
        name = "encode",
        mixinStandardHelpOptions = true,
        description = {
            "Encode standard input into WordPiece tokens, one output line per input line.",
            "Text is normalised as BERT's uncased tokenizer does (lower case, accents stripped, CJK split)."
        })
final class VocabEncodeCommand implements Callable<Integer> {

    @Option(names = "--vocab", required = true, paramLabel = "FILE", description = "The vocabulary file, one token a line.")
    Path vocab;

    @Option(names = "--max-word-chars", paramLabel = "N", defaultValue = "" + WordPieceEncoder.DEFAULT_MAX_WORD_CHARS,
            description = "Words longer than N characters become [UNK] (default: ${DEFAULT-VALUE}).")
    int maxWordChars;

    @Override
    public Integer call() throws IOException {
        WordPieceEncoder encoder = new WordPieceEncoder(WordPieceVocabulary.read(vocab), TextNormalizer.DEFAULT, maxWordChars);
        WordPieceVocabulary vocabulary = encoder.vocabulary();
        Writer out = new BufferedWriter(new OutputStreamWriter(System.out, StandardCharsets.UTF_8), 1 << 16);
        IntList ids = new IntList();
        Utf8Lines.forEach(System.in, "standard input", (line, number) -> {
            ids.clear();
            encoder.encodeIds(line, ids);
            try {
                for (int i = 0; i < ids.size(); i++) {
                    if (i > 0) {
                        out.write(' ');
                    }
                    out.write(vocabulary.token(ids.get(i)));
                }
                out.write('\n');
            } catch (IOException e) {
                throw new UncheckedIOException(e);
            }
        });
        out.flush();
        return Main.EXIT_OK;
    }
}
