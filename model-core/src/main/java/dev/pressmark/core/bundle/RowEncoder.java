package dev.pressmark.core.bundle;

import dev.pressmark.core.feature.FeatureSpace;
import dev.pressmark.core.feature.SpanIndex;
import dev.pressmark.core.tokenize.IntList;
import dev.pressmark.core.tokenize.Tokenizer;
import dev.pressmark.core.tokenize.WordPieceEncoder;
import dev.pressmark.core.tokenize.WordPieceVocabulary;
import java.util.List;

/**
 * Turns one row of text at a time into its feature row, the way the predict path needs it: each
 * view scans the text and hands its tokens over as spans of characters, which are looked up
 * without a string of their own, so character n-grams cost no allocation each. A WordPiece view
 * hands over token ids instead, which map to features through a table built once per model, with
 * no lookup by characters at all. Gives exactly the rows of {@link TextPipeline#transform}, and
 * counts the tokens the model cannot use and those a cut left out. Not thread-safe: one per thread.
 */
public final class RowEncoder {

    private final FeatureSpace.Encoder encoder;
    private final List<Tokenizer> views;
    /** Per text column and view. */
    private final SpanIndex[][] index;
    /**
     * Per text column and view, for a WordPiece view: the feature of each vocabulary id, or
     * {@link SpanIndex#MISSING}; null for the other views.
     */
    private final int[][][] featureOfId;
    /** Per view: whether its tokens are WordPiece pieces (or n-grams of them), for what counts as unknown. */
    private final boolean[] wordPiece;
    private final Counter counter = new Counter();
    private final IntList ids = new IntList(64);
    private final WordPieceEncoder.Scratch scratch = new WordPieceEncoder.Scratch();
    private int unknown;
    private int dropped;

    RowEncoder(FeatureSpace.Encoder encoder, List<Tokenizer> views, SpanIndex[][] index, int[][][] featureOfId,
            boolean[] wordPiece) {
        this.encoder = encoder;
        this.views = views;
        this.index = index;
        this.featureOfId = featureOfId;
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
                if (featureOfId[c][v] != null) {
                    dropped += wordPieces((WordPieceEncoder) views.get(v), text, maxTokensPerField, featureOfId[c][v]);
                } else {
                    counter.index = index[c][v];
                    counter.wordPiece = wordPiece[v];
                    dropped += views.get(v).scan(text, maxTokensPerField, counter);
                }
            }
        }
        return encoder.finish(cols, vals);
    }

    /**
     * Adds the features of {@code text}'s first {@code maxTokens} WordPiece tokens and returns how
     * many tokens the cut left out. Only the unknown token is unknown: as a feature it may have been
     * cut or kept, like any other token of the vocabulary.
     */
    private int wordPieces(WordPieceEncoder view, String text, int maxTokens, int[] features) {
        ids.clear();
        view.encodeIds(text, ids, scratch);
        int kept = Math.min(ids.size(), maxTokens);
        int unk = view.vocabulary().unkId();
        for (int i = 0; i < kept; i++) {
            int id = ids.get(i);
            encoder.add(features[id]);
            unknown += id == unk ? 1 : 0;
        }
        return ids.size() - kept;
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
