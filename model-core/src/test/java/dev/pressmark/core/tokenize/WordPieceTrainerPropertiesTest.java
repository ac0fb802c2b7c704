package dev.pressmark.core.tokenize;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import dev.pressmark.core.PressmarkException;
import dev.pressmark.core.Progress;
import dev.pressmark.core.text.TextNormalizer;
import java.util.ArrayList;
import java.util.Collections;
import java.util.List;
import java.util.Map;
import java.util.SplittableRandom;
import net.jqwik.api.Arbitraries;
import net.jqwik.api.Arbitrary;
import net.jqwik.api.Combinators;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.Provide;
import net.jqwik.api.statistics.Statistics;

class WordPieceTrainerPropertiesTest {

    /** Small alphabet so that pairs repeat and ties are common; two non-ASCII letters and U+1D49C. */
    private static final List<String> LETTERS = List.of("a", "b", "c", "d", "é", "ß", "\uD835\uDC9C");

    record Corpus(Map<String, Long> words, int extraTokens, long minFrequency, int maxWordChars,
            WordPieceTrainer.FloorSchedule schedule) {

        WordCounts counts() {
            WordCounts counts = new WordCounts(TextNormalizer.DEFAULT);
            words.forEach(counts::addWord);
            return counts;
        }

        List<String> initialVocabulary() {
            return NaiveWordPieceTrainer.initialVocabulary(words, maxWordChars);
        }

        int vocabSize() {
            return initialVocabulary().size() + extraTokens;
        }

        WordPieceTrainer.Config config() {
            return new WordPieceTrainer.Config(vocabSize(), minFrequency, maxWordChars);
        }

        WordPieceTrainer trainer() {
            return new WordPieceTrainer(config(), schedule);
        }

        NaiveWordPieceTrainer.Result naive() {
            return NaiveWordPieceTrainer.train(words, vocabSize(), minFrequency, maxWordChars,
                    schedule.maxFirstFloor(), schedule.factor());
        }
    }

    @Provide
    Arbitrary<Corpus> smallCorpora() {
        return corpora(12, 6, 40);
    }

    @Provide
    Arbitrary<Corpus> largerCorpora() {
        return corpora(150, 9, 150);
    }

    private static Arbitrary<Corpus> corpora(int maxWords, int maxLetters, int maxExtraTokens) {
        Arbitrary<String> word = Arbitraries.of(LETTERS).list().ofMinSize(1).ofMaxSize(maxLetters)
                .map(letters -> String.join("", letters));
        Arbitrary<Long> count = Arbitraries.oneOf(Arbitraries.longs().between(1, 12),
                Arbitraries.longs().between(1, 1_000_000));
        return Combinators.combine(
                Arbitraries.maps(word, count).ofMinSize(1).ofMaxSize(maxWords),
                Arbitraries.integers().between(0, maxExtraTokens),
                Arbitraries.longs().between(1, 4),
                Arbitraries.integers().between(1, maxLetters + 1),
                schedules())
                .as(Corpus::new);
    }

    /** The default, the fixed floor, and random starts and steps, coarse to very fine. */
    private static Arbitrary<WordPieceTrainer.FloorSchedule> schedules() {
        Arbitrary<Long> maxFirstFloor = Arbitraries.oneOf(Arbitraries.just(Long.MAX_VALUE), Arbitraries.just(1L),
                Arbitraries.longs().between(1, 2_000_000));
        Arbitrary<Double> factor = Arbitraries.oneOf(Arbitraries.of(0.5, 0.75, 0.9,
                WordPieceTrainer.FloorSchedule.DEFAULT_FACTOR), Arbitraries.doubles().between(0.01, 0.999).ofScale(3));
        return Combinators.combine(maxFirstFloor, factor).as(WordPieceTrainer.FloorSchedule::new);
    }

    @Property(tries = 400)
    void trains_exactly_what_a_full_recount_per_merge_trains(@ForAll("smallCorpora") Corpus corpus) {
        assertMatchesTheFullRecount(corpus);
    }

    @Property(tries = 40)
    void trains_exactly_what_a_full_recount_per_merge_trains_on_larger_tables(
            @ForAll("largerCorpora") Corpus corpus) {
        assertMatchesTheFullRecount(corpus);
    }

    @Property(tries = 100)
    void trains_exactly_what_a_full_recount_trains_when_the_queue_is_rebuilt_often(
            @ForAll("largerCorpora") Corpus corpus) {
        if (corpus.initialVocabulary().size() == WordPieceVocabulary.SPECIAL_TOKENS.size()) {
            return;
        }
        NaiveWordPieceTrainer.Result expected = corpus.naive();

        WordPieceVocabulary actual = new WordPieceTrainer(corpus.config(), corpus.schedule(), 1)
                .train(corpus.counts(), Progress.NONE);

        assertThat(actual.tokens()).isEqualTo(expected.tokens());
    }

    private static void assertMatchesTheFullRecount(Corpus corpus) {
        if (corpus.initialVocabulary().size() == WordPieceVocabulary.SPECIAL_TOKENS.size()) {
            assertThatThrownBy(() -> new WordPieceTrainer(new WordPieceTrainer.Config(100, 1, corpus.maxWordChars()))
                    .train(corpus.counts(), Progress.NONE))
                    .isInstanceOf(PressmarkException.class)
                    .extracting(e -> ((PressmarkException) e).code()).isEqualTo("empty-corpus");
            return;
        }
        NaiveWordPieceTrainer.Result expected = corpus.naive();

        WordPieceVocabulary actual = corpus.trainer().train(corpus.counts(), Progress.NONE);

        assertThat(actual.tokens()).isEqualTo(expected.tokens());
        Statistics.label("stopped before the size").collect(expected.tokens().size() < corpus.vocabSize());
        Statistics.label("stopped before the size").coverage(checker -> checker.check(true).count(n -> n > 0));
    }

    @Property(tries = 100)
    void a_smaller_vocabulary_is_the_start_of_a_larger_one(
            @ForAll("largerCorpora") Corpus corpus, @ForAll("fewerTokens") int fewer) {
        if (corpus.initialVocabulary().size() == WordPieceVocabulary.SPECIAL_TOKENS.size()) {
            return;
        }
        WordPieceVocabulary larger = corpus.trainer().train(corpus.counts(), Progress.NONE);
        int size = Math.max(corpus.initialVocabulary().size(), larger.size() - fewer);
        WordPieceTrainer.Config smaller = new WordPieceTrainer.Config(
                size, corpus.minFrequency(), corpus.maxWordChars());

        WordPieceVocabulary vocabulary = new WordPieceTrainer(smaller, corpus.schedule())
                .train(corpus.counts(), Progress.NONE);

        assertThat(vocabulary.tokens()).isEqualTo(larger.tokens().subList(0, size));
    }

    @Provide
    Arbitrary<Integer> fewerTokens() {
        return Arbitraries.integers().between(1, 60);
    }

    @Property(tries = 200)
    void every_training_word_encodes_without_the_unknown_token(@ForAll("largerCorpora") Corpus corpus) {
        List<String> trainable = new ArrayList<>();
        corpus.words().forEach((word, count) -> {
            if (word.codePointCount(0, word.length()) <= corpus.maxWordChars()) {
                trainable.add(word);
            }
        });
        if (trainable.isEmpty()) {
            return;
        }
        WordPieceVocabulary vocabulary = corpus.trainer().train(corpus.counts(), Progress.NONE);
        WordPieceEncoder encoder = new WordPieceEncoder(vocabulary, TextNormalizer.DEFAULT, corpus.maxWordChars());

        for (String word : trainable) {
            IntList ids = new IntList();
            encoder.encodeWord(word, 0, word.length(), ids);
            StringBuilder joined = new StringBuilder();
            for (int i = 0; i < ids.size(); i++) {
                assertThat(ids.get(i)).as("piece %d of %s", i, word).isNotEqualTo(vocabulary.unkId());
                String piece = vocabulary.token(ids.get(i));
                joined.append(i == 0 ? piece : piece.substring(WordPieceVocabulary.CONTINUATION_PREFIX.length()));
            }
            assertThat(joined.toString()).isEqualTo(word);
        }
    }

    @Property(tries = 100)
    void does_not_depend_on_the_order_in_which_words_are_counted(
            @ForAll("largerCorpora") Corpus corpus, @ForAll long seed) {
        if (corpus.initialVocabulary().size() == WordPieceVocabulary.SPECIAL_TOKENS.size()) {
            return;
        }
        // The same table, built from the words in a shuffled order with each count split in two.
        SplittableRandom random = new SplittableRandom(seed);
        List<String> words = new ArrayList<>(corpus.words().keySet());
        for (int i = words.size() - 1; i > 0; i--) {
            Collections.swap(words, i, random.nextInt(i + 1));
        }
        WordCounts shuffled = new WordCounts(TextNormalizer.DEFAULT);
        for (String word : words) {
            long count = corpus.words().get(word);
            long part = 1 + random.nextLong(count);
            shuffled.addWord(word, part);
            if (part < count) {
                shuffled.addWord(word, count - part);
            }
        }

        assertThat(corpus.trainer().train(shuffled, Progress.NONE))
                .isEqualTo(corpus.trainer().train(corpus.counts(), Progress.NONE));
    }
}
