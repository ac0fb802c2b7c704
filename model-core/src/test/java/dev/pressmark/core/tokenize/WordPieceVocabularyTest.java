package dev.pressmark.core.tokenize;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import dev.pressmark.core.PressmarkException;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class WordPieceVocabularyTest {

    @TempDir
    Path dir;

    private Path file(String content) throws IOException {
        Path file = dir.resolve("vocab.txt");
        Files.writeString(file, content, StandardCharsets.UTF_8);
        return file;
    }

    @Test
    void reads_one_token_a_line_in_id_order() throws IOException {
        WordPieceVocabulary vocabulary = WordPieceVocabulary.read(file("[PAD]\n[UNK]\nun\n##aff\r\n"));
        assertThat(vocabulary.tokens()).containsExactly("[PAD]", "[UNK]", "un", "##aff");
        assertThat(vocabulary.id("##aff")).isEqualTo(3);
        assertThat(vocabulary.id("nope")).isEqualTo(-1);
        assertThat(vocabulary.unkId()).isEqualTo(1);
    }

    @Test
    void round_trips_through_a_file() {
        WordPieceVocabulary vocabulary = WordPieceVocabulary.of(List.of("[UNK]", "ö", "##中", "##\uD83D\uDE00"));
        Path file = dir.resolve("out/vocab.txt");
        vocabulary.write(file);
        assertThat(WordPieceVocabulary.read(file)).isEqualTo(vocabulary);
        assertThat(dir.resolve("out").toFile().list()).containsExactly("vocab.txt");
    }

    @Test
    void refuses_a_duplicate_naming_both_lines() throws IOException {
        Path file = file("[UNK]\na\nb\na\n");
        assertThatThrownBy(() -> WordPieceVocabulary.read(file))
                .isInstanceOf(PressmarkException.class)
                .hasMessage(file + ": line 4: duplicate token \"a\", first on line 2");
    }

    @Test
    void refuses_a_blank_line_naming_it() throws IOException {
        Path file = file("[UNK]\na\n\nb\n");
        assertThatThrownBy(() -> WordPieceVocabulary.read(file))
                .hasMessage(file + ": line 3: blank token; every line must hold one token");
    }

    @Test
    void refuses_a_vocabulary_without_the_unknown_token() throws IOException {
        Path file = file("[PAD]\na\n");
        assertThatThrownBy(() -> WordPieceVocabulary.read(file))
                .hasMessageContaining(file.toString())
                .hasMessageContaining("no [UNK] token");
    }

    @Test
    void refuses_invalid_utf8_with_the_byte_offset() throws IOException {
        Path file = dir.resolve("bad.txt");
        Files.write(file, new byte[] {'[', 'U', 'N', 'K', ']', '\n', 'a', 'b', (byte) 0xC3, '\n'});
        assertThatThrownBy(() -> WordPieceVocabulary.read(file))
                .hasMessage(file + ": line 2: invalid UTF-8 at byte offset 8");
    }

    @Test
    void names_a_missing_file() {
        Path missing = dir.resolve("missing.txt");
        assertThatThrownBy(() -> WordPieceVocabulary.read(missing)).hasMessage(missing + ": no such file");
    }
}
