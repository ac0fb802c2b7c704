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
 * among the pairs with count(ab) at least the current frequency floor F is merged into {@code a + b}
 * without b's {@code ##}, everywhere it occurs; counts are weighted by word frequency over the
 * current segmentation, computed in double precision exactly as {@link LikelihoodMerger#score}.
 * Equal scores go to the higher count(ab), then to the merged token first in String order, then to
 * the left token first in String order, which decides every tie. A merge whose token is already in
 * the vocabulary is applied but adds no token.
 *
 * <p>F starts at the largest pair count before any merge. When no pair reaches F, F falls to
 * {@code floor(F * }{@value FloorSchedule#DEFAULT_FACTOR}{@code )} (see {@link FloorSchedule}),
 * repeatedly, until a pair reaches it, but never below {@code minFrequency}, the final floor.
 * Training stops early, with a note to the progress listener, only when no pair reaches {@code
 * minFrequency}. Frequent merges thus come first, and the likelihood decides within each frequency
 * band. The reason: the score alone favours rare symbols (two symbols that only ever occur together
 * score 1, the maximum, however rare), so under one fixed floor a low floor spends the vocabulary on
 * one-off strings (identifiers, numbers, encoded data) and a high one stops before the vocabulary
 * fills. On the mail corpus of the tests the best fixed floors give 3.54 and 3.23 tokens per
 * whitespace word at 8,000 and 30,000 tokens, the descending floor 3.41 and 3.15 (see {@link
 * FloorSchedule#DEFAULT_FACTOR}). The sequence of merges does not depend on {@code vocabSize}: a
 * smaller vocabulary is the start of a larger one trained on the same words.
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
     * @param minFrequency the final frequency floor: the least weighted count of a pair that may be
     *     merged once the descending floor has reached it
     * @param maxWordChars words with more code points than this are left out of training
     */
    public record Config(int vocabSize, long minFrequency, int maxWordChars) {

        /**
         * The final floor. A pair seen once is one occurrence of one word: merging it memorises that
         * occurrence and says nothing about the rest of the corpus, so 2 is the lowest useful floor.
         * Since the floor descends from the largest pair count, a low final floor no longer spends
         * the vocabulary on rare pairs first; it only lets small corpora fill their vocabulary.
         */
        public static final long DEFAULT_MIN_FREQUENCY = 2;
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

    /**
     * How the frequency floor F descends. F starts at the largest pair count of the initial
     * segmentation, but at most {@code maxFirstFloor}; each time no pair reaches F, it falls to
     * {@code floor(F * factor)} (at least by one), never below {@code min_frequency}.
     *
     * <p>Package-private: users set only the final floor. {@code maxFirstFloor} 1 pins F at
     * min_frequency from the start: one fixed floor, the rule as the NLP Course describes it.
     */
    record FloorSchedule(long maxFirstFloor, double factor) {

        /**
         * Measured on the 6,046 mail bodies (2,195,425 whitespace words) of the corpus that
         * scripts/fetch-test-corpus.sh fetches, as tokens per whitespace word at 8,000 and 30,000
         * tokens with min_frequency 2: factor 0.25 gives 3.465 and 3.174, 0.5 gives 3.420 (3.42002)
         * and 3.158, 0.75 gives 3.412 and 3.151, 0.9 gives 3.409 and 3.151, 0.95 to 0.995 all give
         * 3.407 to 3.408 and 3.1495 to 3.1500, 0.98 the lowest at 30,000 (3.4078 and 3.1495). The
         * fixed floor did no better than 3.54 and 3.23 at any value. Finer steps cost more queue
         * rebuilds: learning 30,000 tokens took 2.2 to 3.2 s against 1.9 to 2.4 s for 0.5, on one
         * core of a shared machine.
         */
        static final double DEFAULT_FACTOR = 0.98;
        static final FloorSchedule DEFAULT = new FloorSchedule(Long.MAX_VALUE, DEFAULT_FACTOR);

        FloorSchedule {
            if (maxFirstFloor < 1) {
                throw new IllegalArgumentException("maxFirstFloor must be >= 1, was " + maxFirstFloor);
            }
            if (!(factor > 0 && factor < 1)) {
                throw new IllegalArgumentException("factor must be in (0, 1), was " + factor);
            }
        }

        /** The first floor, given the largest pair count before any merge. */
        long first(long largestPairCount, long minFrequency) {
            return Math.max(minFrequency, Math.min(largestPairCount, maxFirstFloor));
        }

        /** The floor after {@code floor} once no pair reaches it; {@code floor} must exceed {@code minFrequency}. */
        long next(long floor, long minFrequency) {
            // floor * factor can round up to floor itself for floors near 2^53; the floor must move.
            long lower = Math.min(floor - 1, (long) Math.floor(floor * factor));
            return Math.max(minFrequency, lower);
        }
    }

    /** How many new tokens pass between two progress reports. */
    private static final int PROGRESS_STEP = 256;

    private final Config config;
    private final FloorSchedule schedule;
    private final int minQueueBeforeRebuild;

    public WordPieceTrainer(Config config) {
        this(config, FloorSchedule.DEFAULT, LikelihoodMerger.DEFAULT_MIN_QUEUE_BEFORE_REBUILD);
    }

    /** Lets tests choose the floor schedule. */
    WordPieceTrainer(Config config, FloorSchedule schedule) {
        this(config, schedule, LikelihoodMerger.DEFAULT_MIN_QUEUE_BEFORE_REBUILD);
    }

    /** Lets tests also rebuild the merge queue often, a path that large corpora take. */
    WordPieceTrainer(Config config, FloorSchedule schedule, int minQueueBeforeRebuild) {
        if (config == null) {
            throw new IllegalArgumentException("config must not be null");
        }
        if (schedule == null) {
            throw new IllegalArgumentException("schedule must not be null");
        }
        this.config = config;
        this.schedule = schedule;
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
                table.wordLength(), table.wordCount(), config.minFrequency(), schedule, minQueueBeforeRebuild);
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
