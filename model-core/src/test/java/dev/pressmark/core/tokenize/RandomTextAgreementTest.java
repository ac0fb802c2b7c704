package dev.pressmark.core.tokenize;

import static org.assertj.core.api.Assertions.assertThat;

import dev.pressmark.core.reference.HuggingFaceReference;
import dev.pressmark.core.text.TextNormalizer;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Set;
import java.util.SplittableRandom;
import net.jqwik.api.Arbitraries;
import net.jqwik.api.Arbitrary;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.Provide;
import net.jqwik.api.lifecycle.AfterContainer;
import net.jqwik.api.lifecycle.BeforeContainer;

/**
 * Random Unicode text, encoded by us and by the Hugging Face tokenizers library (the reference,
 * through {@code ai.djl.huggingface:tokenizers}), must give identical tokens. The text mixes
 * accents (precomposed and combining), CJK ideographs, kana, Hangul, emoji, ASCII and Unicode
 * punctuation, control, format and zero-width characters, private-use characters, Unicode spaces, special-casing letters and words longer than the word limit.
 *
 * <p>Lone surrogates are left out: they have no UTF-8 form, so they cannot reach the reference
 * intact (its binding garbles the whole string); {@code TextNormalizerTest} covers them.
 * The characters come from blocks assigned before Unicode 8: the reference classifies
 * characters with tables of about that version, so characters assigned later may be classified
 * differently by it and by the JDK, and are left out on purpose.
 */
class RandomTextAgreementTest {

    private static final int MAX_WORD_CHARS = 40;
    private static HuggingFaceReference uncased;
    private static HuggingFaceReference cased;
    private static WordPieceEncoder uncasedEncoder;
    private static WordPieceEncoder casedEncoder;
    private static Path dir;

    @BeforeContainer
    static void setUp() throws IOException {
        dir = Files.createTempDirectory("pressmark-reference");
        WordPieceVocabulary vocabulary = vocabulary();
        TextNormalizer keepCase = new TextNormalizer(false, false, true);
        uncasedEncoder = new WordPieceEncoder(vocabulary, TextNormalizer.DEFAULT, MAX_WORD_CHARS);
        casedEncoder = new WordPieceEncoder(vocabulary, keepCase, MAX_WORD_CHARS);
        uncased = new HuggingFaceReference(vocabulary, TextNormalizer.DEFAULT, MAX_WORD_CHARS, dir);
        cased = new HuggingFaceReference(vocabulary, keepCase, MAX_WORD_CHARS, dir);
    }

    @AfterContainer
    static void tearDown() throws IOException {
        uncased.close();
        cased.close();
        try (var files = Files.list(dir)) {
            for (Path file : files.toList()) {
                Files.delete(file);
            }
        }
        Files.delete(dir);
    }

    @Property(tries = 2000)
    void random_unicode_text_encodes_exactly_as_the_reference_does(@ForAll("texts") String text) {
        assertThat(uncasedEncoder.tokenize(text)).as("tokens of %s", codePoints(text)).isEqualTo(uncased.tokenize(text));
    }

    @Property(tries = 1000)
    void cased_text_without_accent_stripping_encodes_exactly_as_the_reference_does(@ForAll("texts") String text) {
        assertThat(casedEncoder.tokenize(text)).as("tokens of %s", codePoints(text)).isEqualTo(cased.tokenize(text));
    }

    private static String codePoints(String text) {
        StringBuilder out = new StringBuilder();
        text.codePoints().forEach(cp -> out.append(String.format("U+%04X ", cp)));
        return out.toString().trim();
    }

    @Provide
    Arbitrary<String> texts() {
        return piece().list().ofMinSize(0).ofMaxSize(24).map(pieces -> String.join("", pieces));
    }

    private static Arbitrary<String> piece() {
        return Arbitraries.frequencyOf(
                net.jqwik.api.Tuple.of(8, Arbitraries.strings().withCharRange('a', 'f').withCharRange('A', 'C').ofMinLength(1).ofMaxLength(8)),
                net.jqwik.api.Tuple.of(4, Arbitraries.of(" ", "  ", "\t", "\n", "\r\n", "\u00A0", "\u2003", "\u3000", "\u2028", "\u1680")),
                net.jqwik.api.Tuple.of(3, Arbitraries.of("é", "è", "Ä", "ñ", "Ø", "ç", "ŀ", "ǅ", "ß", "ẞ", "İ", "ı", "Σ", "ς", "Ω", "Ж", "ж", "Å", "K", "ﬁ", "Ａ", "½", "²", "ĳ")),
                net.jqwik.api.Tuple.of(3, Arbitraries.chars().range('\u0300', '\u036F').map(String::valueOf)),
                net.jqwik.api.Tuple.of(3, Arbitraries.chars().range('\u4E00', '\u4E3F').map(String::valueOf)),
                net.jqwik.api.Tuple.of(1, Arbitraries.of("\uF900", "\uFA0E", "\uD840\uDC00", "\uD87E\uDC00", "\u3400")),
                net.jqwik.api.Tuple.of(2, Arbitraries.chars().range('\u3041', '\u3060').map(String::valueOf)),
                net.jqwik.api.Tuple.of(2, Arbitraries.of("한", "국", "어", "가", "\u1100", "\u1161")),
                net.jqwik.api.Tuple.of(2, Arbitraries.integers().between(0x1F600, 0x1F610).map(Character::toString)),
                net.jqwik.api.Tuple.of(3, Arbitraries.of(".", ",", "!", "?", "'", "\"", "$", "+", "^", "`", "|", "~", "#", "-", "_", "@")),
                net.jqwik.api.Tuple.of(2, Arbitraries.of("«", "»", "—", "–", "…", "‘", "’", "“", "”", "、", "。", "¡", "¿", "€", "©", "°")),
                net.jqwik.api.Tuple.of(2, Arbitraries.chars().range('\u0000', '\u001F').map(String::valueOf)),
                net.jqwik.api.Tuple.of(1, Arbitraries.chars().range('\u007F', '\u009F').map(String::valueOf)),
                net.jqwik.api.Tuple.of(2, Arbitraries.of("\u00AD", "\u200B", "\u200C", "\u200D", "\u200E", "\u202A", "\u202E", "\u2060", "\uFEFF", "\u061C")),
                net.jqwik.api.Tuple.of(1, Arbitraries.of("\uFFFD", "\uE000", "\uF8FF", "\uDBFF\uDFFF")),
                net.jqwik.api.Tuple.of(1, Arbitraries.strings().withCharRange('a', 'c').ofMinLength(MAX_WORD_CHARS - 2).ofMaxLength(MAX_WORD_CHARS + 3)));
    }

    /** Characters in both forms, some dropped, plus random short pieces: a vocabulary that covers some words. */
    private static WordPieceVocabulary vocabulary() {
        SplittableRandom random = new SplittableRandom(20261201);
        Set<String> tokens = new LinkedHashSet<>(WordPieceVocabulary.SPECIAL_TOKENS);
        List<String> alphabet = new ArrayList<>();
        for (char c = 'a'; c <= 'f'; c++) {
            alphabet.add(String.valueOf(c));
        }
        for (char c = 'A'; c <= 'C'; c++) {
            alphabet.add(String.valueOf(c));
        }
        for (String s : List.of("é", "e", "ä", "ñ", "n", "ø", "ç", "c", "ǆ", "ß", "i", "ı", "σ", "ς", "ω", "ж", "Ж", "å", "k", "ﬁ", "ａ", "½", "²", "ĳ", "\u0307")) {
            alphabet.add(s);
        }
        for (char c = '\u4E00'; c <= '\u4E3F'; c += 2) {
            alphabet.add(String.valueOf(c));
        }
        for (char c = '\u3041'; c <= '\u3060'; c++) {
            alphabet.add(String.valueOf(c));
        }
        for (String s : List.of("\u1112", "\u1161", "\u11AB", "\u1100", "\uAC00", "\uD55C", "\uD83D\uDE00", "\uD83D\uDE03", ".", ",", "'", "$", "«", "—", "€", "°")) {
            alphabet.add(s);
        }
        for (String c : alphabet) {
            if (random.nextInt(10) > 0) {
                tokens.add(c);
            }
            if (random.nextInt(10) > 0) {
                tokens.add("##" + c);
            }
        }
        for (int i = 0; i < 400; i++) {
            int length = 2 + random.nextInt(4);
            StringBuilder piece = new StringBuilder();
            for (int j = 0; j < length; j++) {
                piece.append(alphabet.get(random.nextInt(9)));
            }
            tokens.add(random.nextBoolean() ? piece.toString() : "##" + piece);
        }
        return WordPieceVocabulary.of(new ArrayList<>(tokens));
    }
}
