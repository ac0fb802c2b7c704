package dev.pressmark.core.tokenize;

import dev.pressmark.core.text.PreTokenizer;
import dev.pressmark.core.text.TextNormalizer;
import java.util.ArrayList;
import java.util.List;

/**
 * Encodes text into WordPiece subwords: normalise, split into words, then cover each word
 * greedily with the longest vocabulary token that matches at the current position, pieces after
 * the first taking the {@code ##} form (Wu et al., "Google's Neural Machine Translation System",
 * 2016; the rule of BERT's reference tokenizer). A word that cannot be covered completely, or that
 * has more than {@code maxWordChars} code points, becomes the single token {@value
 * WordPieceVocabulary#UNK}.
 *
 * <p>Matching walks a {@link SubwordTrie}, so each position costs at most the length of the
 * longest token, independent of the vocabulary size. Instances are immutable and thread-safe; the
 * id path allocates one scratch buffer per call (none when the caller keeps a {@link Scratch}) and
 * nothing per token.
 */
public final class WordPieceEncoder implements Tokenizer {

    /** The reference tokenizer's default for {@code max_word_chars}. */
    public static final int DEFAULT_MAX_WORD_CHARS = 100;

    private final WordPieceVocabulary vocabulary;
    private final TextNormalizer normalizer;
    private final int maxWordChars;
    private final SubwordTrie trie;

    public WordPieceEncoder(WordPieceVocabulary vocabulary, TextNormalizer normalizer, int maxWordChars) {
        if (maxWordChars < 1) {
            throw new IllegalArgumentException("max_word_chars must be >= 1, was " + maxWordChars);
        }
        this.vocabulary = vocabulary;
        this.normalizer = normalizer;
        this.maxWordChars = maxWordChars;
        this.trie = new SubwordTrie(vocabulary);
    }

    public WordPieceEncoder(WordPieceVocabulary vocabulary) {
        this(vocabulary, TextNormalizer.DEFAULT, DEFAULT_MAX_WORD_CHARS);
    }

    public WordPieceVocabulary vocabulary() {
        return vocabulary;
    }

    public TextNormalizer normalizer() {
        return normalizer;
    }

    public int maxWordChars() {
        return maxWordChars;
    }

    /** The token ids of {@code text}. */
    public int[] encodeIds(CharSequence text) {
        IntList ids = new IntList(Math.max(16, text.length() / 3));
        encodeIds(text, ids);
        return ids.toArray();
    }

    /** Appends the token ids of {@code text} to {@code out}. */
    public void encodeIds(CharSequence text, IntList out) {
        encodeIds(text, out, new Scratch());
    }

    /**
     * Appends the token ids of {@code text} to {@code out}, normalising into {@code scratch}, which
     * a caller that encodes many texts on one thread keeps from text to text.
     */
    public void encodeIds(CharSequence text, IntList out, Scratch scratch) {
        StringBuilder normalized = scratch.normalized;
        normalized.setLength(0);
        normalizer.normalize(text, normalized);
        int n = normalized.length();
        char[] chars = scratch.chars(n);
        normalized.getChars(0, n, chars, 0);
        for (int start = PreTokenizer.wordStart(normalized, 0); start < n; ) {
            int end = PreTokenizer.wordEnd(normalized, start);
            encodeWord(chars, start, end, out);
            start = PreTokenizer.wordStart(normalized, end);
        }
    }

    /**
     * The buffers of {@link #encodeIds(CharSequence, IntList, Scratch)}: the normalised text, and
     * its characters in an array, which the greedy match reads several times over without the
     * bounds and coder checks of {@link StringBuilder#charAt}. For one thread at a time.
     */
    public static final class Scratch {

        private final StringBuilder normalized = new StringBuilder(64);
        private char[] chars = new char[64];

        char[] chars(int length) {
            if (chars.length < length) {
                chars = new char[Math.max(length, 2 * chars.length)];
            }
            return chars;
        }
    }

    /** The token strings of {@code text}. */
    @Override
    public List<String> tokenize(String text) {
        IntList ids = new IntList();
        encodeIds(text, ids);
        List<String> tokens = new ArrayList<>(ids.size());
        for (int i = 0; i < ids.size(); i++) {
            tokens.add(vocabulary.token(ids.get(i)));
        }
        return tokens;
    }

    @Override
    public int scan(String text, int maxTokens, Spans sink) {
        IntList ids = new IntList(Math.max(16, text.length() / 3));
        encodeIds(text, ids);
        int kept = Math.min(ids.size(), maxTokens);
        for (int i = 0; i < kept; i++) {
            String token = vocabulary.token(ids.get(i));
            sink.token(token, 0, token.length());
        }
        return ids.size() - kept;
    }

    /**
     * Appends the pieces of one already normalised word, {@code text[start, end)}, to {@code out}:
     * greedy longest match first, or the unknown token when the word cannot be covered.
     */
    public void encodeWord(CharSequence text, int start, int end, IntList out) {
        char[] chars = new char[end - start];
        for (int i = start; i < end; i++) {
            chars[i - start] = text.charAt(i);
        }
        encodeWord(chars, 0, chars.length, out);
    }

    private void encodeWord(char[] text, int start, int end, IntList out) {
        if (end - start > maxWordChars && Character.codePointCount(text, start, end - start) > maxWordChars) {
            out.add(vocabulary.unkId());
            return;
        }
        int mark = out.size();
        int root = SubwordTrie.WORD_ROOT;
        int position = start;
        while (position < end) {
            int matchedToken = SubwordTrie.NONE;
            int matchedEnd = position;
            int node = root;
            for (int i = position; i < end; i++) {
                node = trie.child(node, text[i]);
                if (node == SubwordTrie.NONE) {
                    break;
                }
                int token = trie.token(node);
                if (token != SubwordTrie.NONE && (i + 1 == end || !Character.isLowSurrogate(text[i + 1]))) {
                    matchedToken = token;
                    matchedEnd = i + 1;
                }
            }
            if (matchedToken == SubwordTrie.NONE) {
                out.truncate(mark);
                out.add(vocabulary.unkId());
                return;
            }
            out.add(matchedToken);
            position = matchedEnd;
            root = SubwordTrie.CONTINUATION_ROOT;
        }
    }
}
