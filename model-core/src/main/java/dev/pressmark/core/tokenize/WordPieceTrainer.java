package dev.pressmark.core.tokenize;

import dev.pressmark.core.PressmarkException;
import dev.pressmark.core.Progress;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;

/**
 * Learns a WordPiece vocabulary from a word table by likelihood-scored merges (Schuster and
 * Nakajima, "Japanese and Korean Voice Search", ICASSP 2012). The original training code is not
 * public; the score below is the form in which BERT's WordPiece training is commonly described
 * (Hugging Face NLP Course, chapter 6).
 *
 * <p>The vocabulary starts with {@link WordPieceVocabulary#SPECIAL_TOKENS} in that order, then the
 * alphabet: each code point of the training words in its word-initial form {@code c} if it ever
 * starts a word and in its continuation form {@code ##c} if it ever follows another, all sorted in
 * {@link String} order (UTF-16 code units, so {@code "##x"} sorts before most letters). Every word
 * starts as its alphabet symbols. Then, until the vocabulary holds {@code vocabSize} tokens, the
 * adjacent symbol pair (a, b) with the highest score
 *
 * <pre>    count(ab) / (count(a) * count(b))</pre>
 *
 * is merged into {@code a + b} without b's {@code ##}, everywhere it occurs; counts are weighted
 * by word frequency over the current segmentation, computed in double precision exactly as {@link
 * LikelihoodMerger#score}. Equal scores go to the higher count(ab), then to the merged token first
 * in String order, then to the left token first in String order, which decides every tie. A pair
 * qualifies only if count(ab) is at least {@code minFrequency}. A merge whose token is already in the
 * vocabulary is applied but adds no token. Training stops early, with a note to the progress
 * listener, when no pair qualifies.
 *
 * <p>Words longer than {@code maxWordChars} code points are skipped, as the encoder maps them to
 * {@link WordPieceVocabulary#UNK}. So are words that begin with {@code ##}, which normalised text
 * never holds ({@code #} is punctuation, a word of its own): their word-initial tokens could not be
 * told from continuations. The result depends only on the word table and the config.
 */
public final class WordPieceTrainer {

    /**
     * How a vocabulary is learned.
     *
     * @param vocabSize the number of tokens to learn, special tokens included
     * @param minFrequency the least weighted count of a pair that may be merged
     * @param maxWordChars words with more code points than this are left out of training
     */
    public record Config(int vocabSize, long minFrequency, int maxWordChars) {

        /**
         * The likelihood score favours rare symbols: two symbols that only ever occur together
         * score 1, the maximum, however rare. A low floor therefore spends the vocabulary on
         * one-off strings (identifiers, numbers, encoded data) before common subwords. Measured
         * on the 6,046 mail bodies of the open corpus that scripts/fetch-test-corpus.sh fetches,
         * tokens per whitespace word fall steadily as the floor rises until the vocabulary no
         * longer fills; the best floor grows with the corpus (about 20 for 84 thousand words at
         * 2,000 tokens, 100 for 530 thousand, 30 to 200 for 6.1 million at 30,000 and 8,000
         * tokens). 50 is a compromise across those; a corpus far from them may want its own value.
         */
        public static final long DEFAULT_MIN_FREQUENCY = 50;
        /** The encoder's default, so that training sees exactly the words it can encode. */
        public static final int DEFAULT_MAX_WORD_CHARS = WordPieceEncoder.DEFAULT_MAX_WORD_CHARS;
        /** The special tokens and at least one alphabet symbol. */
        public static final int MIN_VOCAB_SIZE = WordPieceVocabulary.SPECIAL_TOKENS.size() + 1;

        public Config {
            if (vocabSize < MIN_VOCAB_SIZE) {
                throw new IllegalArgumentException("vocab_size must be >= " + MIN_VOCAB_SIZE
                        + " (the special tokens and one symbol), was " + vocabSize);
            }
            if (minFrequency < 1) {
                throw new IllegalArgumentException("min_frequency must be >= 1, was " + minFrequency);
            }
            if (maxWordChars < 1) {
                throw new IllegalArgumentException("max_word_chars must be >= 1, was " + maxWordChars);
            }
        }

        /** {@code vocabSize} tokens with the default minimum frequency and word length. */
        public Config(int vocabSize) {
            this(vocabSize, DEFAULT_MIN_FREQUENCY, DEFAULT_MAX_WORD_CHARS);
        }
    }

    /** How many new tokens pass between two progress reports. */
    private static final int PROGRESS_STEP = 256;

    private final Config config;
    private final int minQueueBeforeRebuild;

    public WordPieceTrainer(Config config) {
        this(config, LikelihoodMerger.DEFAULT_MIN_QUEUE_BEFORE_REBUILD);
    }

    /** Lets tests rebuild the merge queue often, a path that large corpora take. */
    WordPieceTrainer(Config config, int minQueueBeforeRebuild) {
        if (config == null) {
            throw new IllegalArgumentException("config must not be null");
        }
        this.config = config;
        this.minQueueBeforeRebuild = minQueueBeforeRebuild;
    }

    public Config config() {
        return config;
    }

    /**
     * Learns a vocabulary of {@code vocabSize} tokens from {@code counts}, or fewer when no pair
     * qualifies any more. Throws {@link PressmarkException} {@code empty-corpus} when no word can be
     * trained on and {@code vocabulary-too-small} when the special tokens and the alphabet alone
     * exceed {@code vocabSize}.
     */
    public WordPieceVocabulary train(WordCounts counts, Progress progress) {
        WordTable table = WordTable.of(counts, config.maxWordChars());
        List<String> tokens = new ArrayList<>(WordPieceVocabulary.SPECIAL_TOKENS);
        tokens.addAll(table.alphabet());
        int initialSize = tokens.size();
        if (config.vocabSize() < initialSize) {
            throw new PressmarkException("vocabulary-too-small", "vocab_size must be at least " + initialSize
                    + " (" + WordPieceVocabulary.SPECIAL_TOKENS.size() + " special tokens + "
                    + table.alphabet().size() + " alphabet symbols), was " + config.vocabSize());
        }
        LikelihoodMerger merger = new LikelihoodMerger(tokens, table.symbols(), table.wordStart(),
                table.wordLength(), table.wordCount(), config.minFrequency(), minQueueBeforeRebuild);
        progress.start("vocabulary", config.vocabSize() - initialSize);
        int reported = 0;
        boolean exhausted = false;
        while (tokens.size() < config.vocabSize()) {
            if (!merger.mergeBest()) {
                exhausted = true;
                break;
            }
            int learned = tokens.size() - initialSize;
            if (learned - reported >= PROGRESS_STEP) {
                progress.advance(learned);
                reported = learned;
            }
        }
        progress.advance(tokens.size() - initialSize);
        if (exhausted) {
            progress.note("vocabulary stopped at " + tokens.size() + " of " + config.vocabSize()
                    + " tokens: no pair of symbols is left that occurs at least min_frequency ("
                    + config.minFrequency() + ") times");
        }
        progress.finish();
        return WordPieceVocabulary.of(tokens);
    }

    /**
     * The training words as alphabet symbol ids, one flat array, in the word table's String order.
     */
    record WordTable(List<String> alphabet, int[] symbols, int[] wordStart, int[] wordLength, long[] wordCount) {

        static WordTable of(WordCounts counts, int maxWordChars) {
            Collector collector = new Collector(maxWordChars);
            counts.forEachSorted(collector);
            IntList starts = collector.starts;
            IntList codePoints = collector.codePoints;
            LongIntMap alphabetKeys = collector.alphabetKeys;
            int words = starts.size();
            if (words == 0) {
                throw new PressmarkException("empty-corpus", counts.distinctWords() == 0
                        ? "no words to learn a vocabulary from"
                        : "no words to learn a vocabulary from: all " + counts.distinctWords()
                                + " distinct words are longer than max_word_chars " + maxWordChars
                                + " or begin with " + WordPieceVocabulary.CONTINUATION_PREFIX);
            }
            long[] keys = alphabetKeys.keys();
            String[] alphabet = new String[keys.length];
            for (int i = 0; i < keys.length; i++) {
                alphabet[i] = alphabetString(keys[i]);
            }
            Arrays.sort(alphabet);
            LongIntMap symbolIds = new LongIntMap(alphabet.length);
            for (int i = 0; i < alphabet.length; i++) {
                symbolIds.putIfAbsent(alphabetKey(alphabet[i]), WordPieceVocabulary.SPECIAL_TOKENS.size() + i);
            }
            int[] symbols = codePoints.toArray();
            int[] wordStart = starts.toArray();
            int[] wordLength = new int[words];
            for (int w = 0; w < words; w++) {
                int start = wordStart[w];
                int end = w + 1 < words ? wordStart[w + 1] : symbols.length;
                wordLength[w] = end - start;
                for (int i = start; i < end; i++) {
                    symbols[i] = symbolIds.get(alphabetKey(symbols[i], i > start));
                }
            }
            return new WordTable(List.of(alphabet), symbols, wordStart, wordLength,
                    Arrays.copyOf(collector.frequencies, words));
        }

        private static long alphabetKey(int codePoint, boolean continuation) {
            return ((long) codePoint << 1) | (continuation ? 1 : 0);
        }

        private static long alphabetKey(String symbol) {
            boolean continuation = symbol.startsWith(WordPieceVocabulary.CONTINUATION_PREFIX);
            int cp = symbol.codePointAt(continuation ? WordPieceVocabulary.CONTINUATION_PREFIX.length() : 0);
            return alphabetKey(cp, continuation);
        }

        /** Gathers the trainable words as code points and their alphabet. */
        private static final class Collector implements WordCounts.WordConsumer {

            private final int maxWordChars;
            private final IntList codePoints = new IntList(1024);
            private final IntList starts = new IntList(1024);
            private long[] frequencies = new long[1024];
            // An alphabet key is the code point shifted left by one, the low bit set for the ## form.
            private final LongIntMap alphabetKeys = new LongIntMap(256);

            Collector(int maxWordChars) {
                this.maxWordChars = maxWordChars;
            }

            @Override
            public void word(String word, long count) {
                if (word.startsWith(WordPieceVocabulary.CONTINUATION_PREFIX)
                        || word.codePointCount(0, word.length()) > maxWordChars) {
                    return;
                }
                int w = starts.size();
                if (w == frequencies.length) {
                    frequencies = Arrays.copyOf(frequencies, w * 2);
                }
                frequencies[w] = count;
                starts.add(codePoints.size());
                for (int i = 0; i < word.length(); ) {
                    int cp = word.codePointAt(i);
                    alphabetKeys.putIfAbsent(alphabetKey(cp, i > 0), 0);
                    codePoints.add(cp);
                    i += Character.charCount(cp);
                }
            }
        }

        private static String alphabetString(long key) {
            String c = new String(Character.toChars((int) (key >>> 1)));
            return (key & 1) == 1 ? WordPieceVocabulary.CONTINUATION_PREFIX + c : c;
        }
    }
}
