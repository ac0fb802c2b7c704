package dev.pressmark.core.tokenize;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import dev.pressmark.core.PressmarkException;
import dev.pressmark.core.Progress;
import dev.pressmark.core.text.TextNormalizer;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class WordPieceTrainerTest {

    private static final List<String> SPECIALS = List.of("[PAD]", "[UNK]", "[CLS]", "[SEP]", "[MASK]");

    /**
     * The corpus of the Hugging Face NLP Course, chapter 6, "WordPiece tokenization" (from memory):
     * ("hug", 10), ("pug", 5), ("pun", 12), ("bun", 4), ("hugs", 5).
     */
    private static WordCounts courseCorpus() {
        WordCounts counts = new WordCounts(TextNormalizer.DEFAULT);
        counts.addWord("hug", 10);
        counts.addWord("pug", 5);
        counts.addWord("pun", 12);
        counts.addWord("bun", 4);
        counts.addWord("hugs", 5);
        return counts;
    }

    /**
     * The floor pinned at min_frequency from the first merge: the rule as the course describes it,
     * one fixed threshold and the best score among all pairs above it.
     */
    private static final WordPieceTrainer.FloorSchedule FIXED_FLOOR =
            new WordPieceTrainer.FloorSchedule(1, WordPieceTrainer.FloorSchedule.DEFAULT_FACTOR);

    /** Trains under the fixed floor, which the published examples below follow. */
    private static WordPieceVocabulary train(WordCounts counts, int vocabSize, long minFrequency) {
        return train(counts, vocabSize, minFrequency, FIXED_FLOOR);
    }

    private static WordPieceVocabulary train(WordCounts counts, int vocabSize, long minFrequency,
            WordPieceTrainer.FloorSchedule schedule) {
        return new WordPieceTrainer(new WordPieceTrainer.Config(vocabSize, minFrequency, 100), schedule)
                .train(counts, Progress.NONE);
    }

    @Test
    void starts_with_the_special_tokens_and_the_alphabet_of_the_course_example() {
        // Hugging Face NLP Course, ch. 6, "WordPiece tokenization" (from memory): the alphabet of the
        // corpus is ["##g", "##n", "##s", "##u", "b", "h", "p"].
        WordPieceVocabulary vocabulary = train(courseCorpus(), 12, 1);

        assertThat(vocabulary.tokens()).containsExactly(
                "[PAD]", "[UNK]", "[CLS]", "[SEP]", "[MASK]", "##g", "##n", "##s", "##u", "b", "h", "p");
    }

    @Test
    void learns_the_first_merge_of_the_course_example() {
        // Hugging Face NLP Course, ch. 6, "WordPiece tokenization" (from memory): the first merge is
        // ("##g", "##s") -> "##gs". Symbol counts: h 15, p 17, b 4, ##u 36, ##g 20, ##n 16, ##s 5.
        // Scores: (##g, ##s) 5 / (20 * 5) = 1/20; (h, ##u) 15 / (15 * 36), (p, ##u) 17 / (17 * 36),
        // (b, ##u) 4 / (4 * 36), (##u, ##g) 20 / (36 * 20), (##u, ##n) 16 / (36 * 16): all 1/36.
        WordPieceVocabulary vocabulary = train(courseCorpus(), 13, 1);

        assertThat(vocabulary.tokens()).endsWith("##gs").hasSize(13);
    }

    @Test
    void encodes_the_course_examples_with_the_trained_tokens() {
        // Hugging Face NLP Course, ch. 6, "WordPiece tokenization" (from memory): with a vocabulary
        // that holds "hu" and "hug" besides the first merge, "hugs" -> ["hug", "##s"],
        // "bugs" -> ["b", "##u", "##gs"], and "mug" and "bum" -> ["[UNK]"] ("m" and "##m" are unknown).
        List<String> tokens = new ArrayList<>(train(courseCorpus(), 13, 1).tokens());
        tokens.add("hu");
        tokens.add("hug");
        WordPieceEncoder encoder = new WordPieceEncoder(WordPieceVocabulary.of(tokens));

        assertThat(encoder.tokenize("hugs")).containsExactly("hug", "##s");
        assertThat(encoder.tokenize("bugs")).containsExactly("b", "##u", "##gs");
        assertThat(encoder.tokenize("mug")).containsExactly("[UNK]");
        assertThat(encoder.tokenize("bum")).containsExactly("[UNK]");
    }

    /**
     * The word counts that the implementation part of the same course section prints for its
     * four-sentence corpus (cased pre-tokenisation; notebook output as stored at
     * runalph.ai/notebooks/huggingface/section6-4).
     */
    private static WordCounts courseImplementationCorpus() {
        WordCounts counts = new WordCounts(TextNormalizer.DEFAULT);
        counts.addWord("This", 3);
        counts.addWord("is", 2);
        counts.addWord(".", 4);
        for (String word : List.of("the", "Hugging", "Face", "Course", "chapter", "about", "tokenization",
                "section", "shows", "several", "tokenizer", "algorithms", "Hopefully", ",", "you", "will", "be",
                "able", "to", "understand", "how", "they", "are", "trained", "and", "generate", "tokens")) {
            counts.addWord(word, 1);
        }
        return counts;
    }

    /** The alphabet that the course's implementation prints for that corpus. */
    private static final List<String> COURSE_IMPLEMENTATION_ALPHABET = List.of(
            "##a", "##b", "##c", "##d", "##e", "##f", "##g", "##h", "##i", "##k", "##l", "##m", "##n", "##o", "##p",
            "##r", "##s", "##t", "##u", "##v", "##w", "##y", "##z", ",", ".", "C", "F", "H", "T", "a", "b", "c", "g",
            "h", "i", "s", "t", "u", "w", "y");

    @Test
    void learns_the_alphabet_and_first_merge_that_the_course_implementation_prints() {
        // Same source: the best first pair is ("a", "##b") with score 0.2. Check: "about" and "able"
        // give count(a ##b) = 2; "a" starts about, able, are, and, algorithms (5); "##b" occurs in
        // about and able (2): 2 / (5 * 2) = 0.2. Printed scores of other pairs agree with the same
        // counting, e.g. (T, ##h) 3 / (3 * 8) = 0.125 and (i, ##s) 2 / (2 * 10) = 0.1.
        WordPieceVocabulary vocabulary = train(courseImplementationCorpus(), 46, 1);

        List<String> expected = new ArrayList<>(SPECIALS);
        expected.addAll(COURSE_IMPLEMENTATION_ALPHABET);
        expected.add("ab");
        assertThat(vocabulary.tokens()).containsExactlyElementsOf(expected);
    }

    @Test
    void encodes_as_the_course_implementation_does_with_its_learned_tokens() {
        // Same source. Its later merges are ties broken by dictionary order, so the learned tokens
        // are taken as printed, after our special tokens and alphabet; the inputs are from memory,
        // the outputs as printed.
        List<String> tokens = new ArrayList<>(train(courseImplementationCorpus(), 45, 1).tokens());
        tokens.addAll(List.of("##fu", "Fa", "Fac", "##ct", "##ful", "##full", "##fully", "Th", "ch", "##hm", "cha",
                "chap", "chapt", "##thm", "Hu", "Hug", "Hugg", "sh", "th", "is", "##thms", "##za", "##zat", "##ut"));
        WordPieceEncoder encoder = new WordPieceEncoder(
                WordPieceVocabulary.of(tokens), new TextNormalizer(false, false, true), 100);

        assertThat(encoder.tokenize("Hugging")).containsExactly("Hugg", "##i", "##n", "##g");
        assertThat(encoder.tokenize("HOgging")).containsExactly("[UNK]");
        assertThat(encoder.tokenize("This is the Hugging Face course!")).containsExactly(
                "Th", "##i", "##s", "is", "th", "##e", "Hugg", "##i", "##n", "##g", "Fac", "##e",
                "c", "##o", "##u", "##r", "##s", "##e", "[UNK]");
    }

    @Test
    void breaks_equal_scores_by_the_higher_pair_count_and_leaves_pairs_below_min_frequency() {
        // Counts from the course example above: with min_frequency 6, (##g, ##s) (5) and (b, ##u) (4)
        // do not qualify; the rest tie at 1/36, and (##u, ##g) has the highest count, 20.
        WordPieceVocabulary vocabulary = train(courseCorpus(), 13, 6);

        assertThat(vocabulary.tokens()).endsWith("##ug").doesNotContain("##gs");
    }

    @Test
    void starts_the_descending_floor_at_the_largest_pair_count() {
        // Hand-worked on the course counts above: the largest pair count is (##u, ##g) with 20, so
        // under the default schedule it is the only pair in the first band and merges first.
        WordPieceVocabulary vocabulary = new WordPieceTrainer(new WordPieceTrainer.Config(13, 1, 100))
                .train(courseCorpus(), Progress.NONE);

        assertThat(vocabulary.tokens()).endsWith("##ug").hasSize(13);
    }

    /** A floor that starts at the largest pair count and falls by {@code factor}. */
    private static WordPieceTrainer.FloorSchedule descending(double factor) {
        return new WordPieceTrainer.FloorSchedule(Long.MAX_VALUE, factor);
    }

    /** fg 25, f 100, ae 20, ab 10, cd 15. */
    private static WordCounts bandCorpus() {
        WordCounts counts = new WordCounts(TextNormalizer.DEFAULT);
        counts.addWord("fg", 25);
        counts.addWord("f", 100);
        counts.addWord("ae", 20);
        counts.addWord("ab", 10);
        counts.addWord("cd", 15);
        return counts;
    }

    @Test
    void merges_the_most_frequent_band_first_and_ranks_by_score_within_each_band() {
        // Hand-worked. Counts: f 125, ##g 25, a 30, ##e 20, ##b 10, c 15, ##d 15. Pairs and scores:
        // (f, ##g) 25 / (125 * 25) = 0.008, (a, ##e) 20 / (30 * 20) = 1/30, (a, ##b) 10 / (30 * 10)
        // = 1/30, (c, ##d) 15 / (15 * 15) = 1/15. Floor 25: only fg. Floor 12: ae (20) and cd (15)
        // qualify and cd has the higher score despite the lower count. Then ae at floor 12; ab (10)
        // needs floor 6.
        WordPieceVocabulary halving = train(bandCorpus(), 16, 1, descending(0.5));
        // With a floor of 1 throughout, score alone decides: cd, then ae before ab on the higher count
        // (both 1/30), then fg.
        WordPieceVocabulary fixed = train(bandCorpus(), 16, 1);

        List<String> alphabet = new ArrayList<>(SPECIALS);
        alphabet.addAll(List.of("##b", "##d", "##e", "##g", "a", "c", "f"));
        assertThat(halving.tokens()).startsWith(alphabet.toArray(String[]::new)).endsWith("fg", "cd", "ae", "ab");
        assertThat(fixed.tokens()).endsWith("cd", "ae", "ab", "fg");
    }

    @Test
    void lowers_the_floor_by_the_factor_and_not_below_min_frequency() {
        // Hand-worked on the counts above with factor 3/4: floors 25 (fg), 18 (ae), 13 (cd), then 9
        // would pass below min_frequency 12, so the floor stops at 12 and ab (10) never merges.
        RecordingProgress progress = new RecordingProgress();
        WordPieceVocabulary vocabulary = new WordPieceTrainer(new WordPieceTrainer.Config(16, 12, 100),
                descending(0.75)).train(bandCorpus(), progress);
        WordPieceVocabulary lowerFinal = train(bandCorpus(), 16, 9, descending(0.75));

        assertThat(vocabulary.tokens()).endsWith("fg", "ae", "cd").hasSize(15);
        assertThat(progress.events).contains("note vocabulary stopped at 15 of 16 tokens: no pair of symbols is left"
                + " that occurs at least min_frequency (12) times");
        assertThat(lowerFinal.tokens()).endsWith("fg", "ae", "cd", "ab");
    }

    @Test
    void breaks_equal_scores_and_counts_by_the_merged_token_in_string_order() {
        // Hand-worked: (c, ##d) and (a, ##b) both score 1 / (1 * 1) with count 1; "ab" < "cd".
        WordCounts counts = new WordCounts(TextNormalizer.DEFAULT);
        counts.addWord("cd", 1);
        counts.addWord("ab", 1);

        assertThat(train(counts, 10, 1).tokens()).containsExactly(
                "[PAD]", "[UNK]", "[CLS]", "[SEP]", "[MASK]", "##b", "##d", "a", "c", "ab");
    }

    @Test
    void merges_until_no_pair_is_left_and_notes_the_size_reached() {
        RecordingProgress progress = new RecordingProgress();

        WordPieceVocabulary vocabulary = new WordPieceTrainer(new WordPieceTrainer.Config(1000, 1, 100))
                .train(courseCorpus(), progress);

        // With min_frequency 1, training ends only when every word is a single symbol.
        assertThat(vocabulary.tokens()).contains("hug", "pug", "pun", "bun", "hugs");
        int learned = vocabulary.size() - 12;
        assertThat(progress.events).first().isEqualTo("start vocabulary " + (1000 - 12));
        assertThat(progress.events).contains("advance " + learned,
                "note vocabulary stopped at " + vocabulary.size()
                        + " of 1000 tokens: no pair of symbols is left that occurs at least min_frequency (1) times");
        assertThat(progress.events).last().isEqualTo("finish");
    }

    @Test
    void reports_progress_without_a_note_when_the_size_is_reached() {
        RecordingProgress progress = new RecordingProgress();

        new WordPieceTrainer(new WordPieceTrainer.Config(14, 1, 100)).train(courseCorpus(), progress);

        assertThat(progress.events).containsExactly("start vocabulary 2", "advance 2", "finish");
    }

    @Test
    void skips_words_longer_than_max_word_chars_and_words_that_begin_with_the_continuation_prefix() {
        WordCounts counts = new WordCounts(TextNormalizer.DEFAULT);
        counts.addWord("hu", 3);
        counts.addWord("xyz", 7);
        counts.addWord("##q", 7);

        WordPieceVocabulary vocabulary = new WordPieceTrainer(new WordPieceTrainer.Config(8, 1, 2))
                .train(counts, Progress.NONE);

        assertThat(vocabulary.tokens()).containsExactly("[PAD]", "[UNK]", "[CLS]", "[SEP]", "[MASK]", "##u", "h", "hu");
    }

    @Test
    void keeps_a_surrogate_pair_whole() {
        WordCounts counts = new WordCounts(TextNormalizer.DEFAULT);
        counts.addWord("a\uD835\uDC9C", 2); // a, U+1D49C MATHEMATICAL SCRIPT CAPITAL A

        assertThat(train(counts, 8, 1).tokens()).containsExactly(
                "[PAD]", "[UNK]", "[CLS]", "[SEP]", "[MASK]", "##\uD835\uDC9C", "a", "a\uD835\uDC9C");
    }

    @Test
    void refuses_a_size_below_the_special_tokens_and_the_alphabet_and_names_the_minimum() {
        assertThatThrownBy(() -> train(courseCorpus(), 11, 1))
                .isInstanceOf(PressmarkException.class)
                .hasMessage("vocab_size must be at least 12 (5 special tokens + 7 alphabet symbols), was 11")
                .extracting(e -> ((PressmarkException) e).code()).isEqualTo("vocabulary-too-small");
    }

    @Test
    void refuses_an_empty_corpus() {
        assertThatThrownBy(() -> train(new WordCounts(TextNormalizer.DEFAULT), 100, 1))
                .isInstanceOf(PressmarkException.class)
                .hasMessage("no words to learn a vocabulary from")
                .extracting(e -> ((PressmarkException) e).code()).isEqualTo("empty-corpus");
    }

    @Test
    void refuses_a_corpus_whose_words_are_all_too_long() {
        WordCounts counts = new WordCounts(TextNormalizer.DEFAULT);
        counts.addWord("abcdef", 1);

        assertThatThrownBy(() -> new WordPieceTrainer(new WordPieceTrainer.Config(100, 1, 5))
                .train(counts, Progress.NONE))
                .isInstanceOf(PressmarkException.class)
                .hasMessageContaining("all 1 distinct words are longer than max_word_chars 5")
                .extracting(e -> ((PressmarkException) e).code()).isEqualTo("empty-corpus");
    }

    @Test
    void refuses_invalid_config_values_naming_the_field_the_bound_and_the_value() {
        assertThatThrownBy(() -> new WordPieceTrainer.Config(5, 1, 100))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessage("vocab_size must be >= 6 (the special tokens and one symbol), was 5");
        assertThatThrownBy(() -> new WordPieceTrainer.Config(100, 0, 100))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessage("min_frequency must be >= 1, was 0");
        assertThatThrownBy(() -> new WordPieceTrainer.Config(100, 1, 0))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessage("max_word_chars must be >= 1, was 0");
        assertThatThrownBy(() -> new WordPieceTrainer(null))
                .isInstanceOf(IllegalArgumentException.class);
    }

    @Test
    void defaults_to_the_encoder_word_length_and_the_documented_min_frequency() {
        WordPieceTrainer.Config config = new WordPieceTrainer.Config(500);

        assertThat(config.maxWordChars()).isEqualTo(WordPieceEncoder.DEFAULT_MAX_WORD_CHARS);
        assertThat(config.minFrequency()).isEqualTo(WordPieceTrainer.Config.DEFAULT_MIN_FREQUENCY);
        // The value the README's defaults table states.
        assertThat(config.minFrequency()).isEqualTo(2);
    }

    @Test
    void refuses_a_floor_schedule_that_would_not_descend() {
        assertThatThrownBy(() -> new WordPieceTrainer.FloorSchedule(0, 0.5))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessage("maxFirstFloor must be >= 1, was 0");
        assertThatThrownBy(() -> new WordPieceTrainer.FloorSchedule(10, 1.0))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessage("factor must be in (0, 1), was 1.0");
        assertThatThrownBy(() -> new WordPieceTrainer.FloorSchedule(10, 0.0))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessage("factor must be in (0, 1), was 0.0");
    }

    @Test
    void gives_the_same_file_bytes_when_trained_twice_and_when_fed_in_another_order(@TempDir Path dir)
            throws IOException {
        String text = "the quick brown fox jumps over the lazy dog; the dog sleeps, the fox runs. "
                + "Über naïve café façade: señor, smörgåsbord and 数据 and 𝒜lpha betas.";
        WordCounts forward = new WordCounts(TextNormalizer.DEFAULT);
        WordCounts backward = new WordCounts(TextNormalizer.DEFAULT);
        List<String> sentences = List.of(text.split("(?<=[.;])"));
        for (int repeat = 0; repeat < 3; repeat++) {
            for (String sentence : sentences) {
                forward.addText(sentence);
            }
            for (int i = sentences.size() - 1; i >= 0; i--) {
                backward.addText(sentences.get(i));
            }
        }
        WordPieceVocabulary first = train(forward, 120, 1);
        WordPieceVocabulary second = train(forward, 120, 1);
        WordPieceVocabulary reordered = train(backward, 120, 1);
        first.write(dir.resolve("first.txt"));
        second.write(dir.resolve("second.txt"));
        reordered.write(dir.resolve("reordered.txt"));

        assertThat(first.tokens()).startsWith(SPECIALS.toArray(String[]::new));
        assertThat(second).isEqualTo(first);
        assertThat(reordered).isEqualTo(first);
        assertThat(Files.readAllBytes(dir.resolve("second.txt"))).isEqualTo(Files.readAllBytes(dir.resolve("first.txt")));
        assertThat(Files.readAllBytes(dir.resolve("reordered.txt"))).isEqualTo(Files.readAllBytes(dir.resolve("first.txt")));
    }

    /** Records the calls a trainer makes, one string each. */
    private static final class RecordingProgress implements Progress {

        final List<String> events = new ArrayList<>();

        @Override
        public void start(String task, long total) {
            events.add("start " + task + " " + total);
        }

        @Override
        public void advance(long done) {
            events.add("advance " + done);
        }

        @Override
        public void finish() {
            events.add("finish");
        }

        @Override
        public void note(String message) {
            events.add("note " + message);
        }
    }
}
