package dev.pressmark.core.bundle;

import dev.pressmark.core.feature.FeatureSpace;
import dev.pressmark.core.feature.SpanIndex;
import dev.pressmark.core.tokenize.Tokenizer;
import dev.pressmark.core.tokenize.WordPieceVocabulary;
import java.util.List;

/**
 * Turns one row of text at a time into its feature row, the way the predict path needs it: each
 * view scans the text and hands its tokens over as spans of characters, which are looked up
 * without a string of their own, so character n-grams cost no allocation each. Gives exactly the
 * rows of {@link TextPipeline#transform}, and counts the tokens the model cannot use and those a
 * cut left out. Not thread-safe: one per thread.
 */
public final class RowEncoder {

    private final FeatureSpace.Encoder encoder;
    private final List<Tokenizer> views;
    /** Per text column and view. */
    private final SpanIndex[][] index;
    private final boolean[] wordPiece;
    private final Counter counter = new Counter();
    private int unknown;
    private int dropped;

    RowEncoder(FeatureSpace.Encoder encoder, List<Tokenizer> views, SpanIndex[][] index, boolean[] wordPiece) {
        this.encoder = encoder;
        this.views = views;
        this.index = index;
        this.wordPiece = wordPiece;
    }

    /**
     * Writes the features of {@code row} (one text per column) into {@code cols} and {@code vals},
     * each field of each view cut to its first {@code maxTokensPerField} tokens, and returns how
     * many it wrote. Both arrays must hold at least one entry per feature.
     */
    public int encode(String[] row, int maxTokensPerField, int[] cols, double[] vals) {
        unknown = 0;
        dropped = 0;
        for (int c = 0; c < row.length; c++) {
            String text = row[c] == null ? "" : row[c];
            for (int v = 0; v < views.size(); v++) {
                counter.index = index[c][v];
                counter.wordPiece = wordPiece[v];
                dropped += views.get(v).scan(text, maxTokensPerField, counter);
            }
        }
        return encoder.finish(cols, vals);
    }

    /** How many tokens of the last row the model cannot use, as {@link TextPipeline#unknownTokens} counts them. */
    public int unknownTokens() {
        return unknown;
    }

    /** How many tokens of the last row the cut left out. */
    public int droppedTokens() {
        return dropped;
    }

    private final class Counter implements Tokenizer.Spans {

        private SpanIndex index;
        private boolean wordPiece;

        @Override
        public void token(CharSequence chars, int start, int end) {
            int j = index.get(chars, start, end);
            encoder.add(j);
            boolean known = wordPiece ? !isUnk(chars, start, end) : j >= 0;
            unknown += known ? 0 : 1;
        }
    }

    private static boolean isUnk(CharSequence chars, int start, int end) {
        String unk = WordPieceVocabulary.UNK;
        if (end - start != unk.length()) {
            return false;
        }
        for (int i = 0; i < unk.length(); i++) {
            if (chars.charAt(start + i) != unk.charAt(i)) {
                return false;
            }
        }
        return true;
    }
}
