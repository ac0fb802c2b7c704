package dev.pressmark.cli;

import static org.assertj.core.api.Assertions.assertThat;

import dev.pressmark.core.tokenize.WordPieceVocabulary;
import dev.pressmark.demo.ListingTitles;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

@Tag("slow") // a child JVM per case
class VocabTrainCommandTest {

    @TempDir
    Path dir;

    private Path corpus() throws IOException {
        Path file = dir.resolve("corpus.txt");
        StringBuilder text = new StringBuilder();
        for (ListingTitles.Listing listing : ListingTitles.generate(2000, 1)) {
            text.append(listing.title()).append('\n');
        }
        Files.writeString(file, text, StandardCharsets.UTF_8);
        return file;
    }

    @Test
    void writes_a_vocabulary_that_starts_with_the_special_tokens_and_encodes_its_corpus() throws IOException {
        Path out = dir.resolve("vocab.txt");
        CommandRun run = CommandRun.run(dir, "vocab", "train", "--data", corpus().toString(), "--size", "300", "--out", out.toString());
        assertThat(run.exitCode()).as(run.err()).isZero();
        WordPieceVocabulary vocabulary = WordPieceVocabulary.read(out);
        assertThat(vocabulary.size()).isEqualTo(300);
        assertThat(vocabulary.tokens().subList(0, 5)).containsExactly("[PAD]", "[UNK]", "[CLS]", "[SEP]", "[MASK]");
        // "Brassvolt" never occurs in the titles: it can only be covered by subword pieces.
        CommandRun encoded = CommandRun.of(dir, "Brassvolt ball valve\n", "vocab", "encode", "--vocab", out.toString());
        assertThat(encoded.out()).doesNotContain("[UNK]").contains("##");
    }

    @Test
    void the_same_corpus_and_size_give_the_same_file_byte_for_byte() throws IOException {
        Path corpus = corpus();
        assertThat(CommandRun.run(dir, "vocab", "train", "--data", corpus.toString(), "--size", "200", "--out", "a.txt").exitCode()).isZero();
        assertThat(CommandRun.run(dir, "vocab", "train", "--data", corpus.toString(), "--size", "200", "--out", "b.txt").exitCode()).isZero();
        assertThat(Files.readAllBytes(dir.resolve("a.txt"))).isEqualTo(Files.readAllBytes(dir.resolve("b.txt")));
    }

    @Test
    void a_size_below_the_alphabet_is_refused_naming_the_minimum_and_writes_nothing() throws IOException {
        CommandRun run = CommandRun.run(dir, "vocab", "train", "--data", corpus().toString(), "--size", "10", "--out", "v.txt");
        assertThat(run.exitCode()).isEqualTo(1);
        assertThat(run.err()).containsPattern("size must be at least \\d+");
        assertThat(dir.resolve("v.txt")).doesNotExist();
        assertThat(dir.toFile().list()).containsExactly("corpus.txt");
    }

    @Test
    void a_missing_data_file_names_the_path() {
        CommandRun run = CommandRun.run(dir, "vocab", "train", "--data", "missing.txt", "--size", "100", "--out", "v.txt");
        assertThat(run.exitCode()).isEqualTo(1);
        assertThat(run.err()).isEqualTo("pressmark: missing.txt: no such file\n");
    }

    @Test
    void invalid_utf8_in_the_data_names_the_line_and_byte_offset() throws IOException {
        Files.write(dir.resolve("bad.txt"), new byte[] {'a', 'b', '\n', 'c', 'd', 'e', (byte) 0xC0, (byte) 0x80, '\n'});
        CommandRun run = CommandRun.run(dir, "vocab", "train", "--data", "bad.txt", "--size", "100", "--out", "v.txt");
        assertThat(run.exitCode()).isEqualTo(1);
        assertThat(run.err()).isEqualTo("pressmark: bad.txt: line 2: invalid UTF-8 at byte offset 6\n");
        assertThat(dir.resolve("v.txt")).doesNotExist();
    }

    @Test
    void a_non_numeric_size_is_a_usage_error() throws IOException {
        CommandRun run = CommandRun.run(dir, "vocab", "train", "--data", corpus().toString(), "--size", "many", "--out", "v.txt");
        assertThat(run.exitCode()).isEqualTo(2);
    }
}
