package dev.pressmark.core.bundle;

import dev.pressmark.core.feature.FeatureSpace;
import dev.pressmark.core.feature.SparseMatrix;
import dev.pressmark.core.tokenize.Tokenizer;
import dev.pressmark.core.tokenize.WordPieceVocabulary;
import java.util.ArrayList;
import java.util.List;
import java.util.Objects;

/**
 * The frozen preprocessing of a model: a tokenizer shared by every text column and the fitted
 * feature space. Training builds one per fold and one for the final model; serving rebuilds the
 * final one from the bundle, so both apply exactly the same steps. Immutable and thread-safe.
 *
 * @param spec how the tokenizer was made, as the bundle stores it
 * @param tokenizer the tokenizer {@code spec} describes
 * @param features the fitted feature space; its columns are the model's input fields
 */
public record TextPipeline(TokenizerSpec spec, Tokenizer tokenizer, FeatureSpace features) {

    public TextPipeline {
        Objects.requireNonNull(spec, "spec");
        Objects.requireNonNull(tokenizer, "tokenizer");
        Objects.requireNonNull(features, "features");
    }

    /** The text columns, in the order rows list them. */
    public List<String> columns() {
        return features.columns();
    }

    /** The tokens of each column of each row. */
    public static List<List<List<String>>> tokenize(Tokenizer tokenizer, List<String[]> rows) {
        List<List<List<String>>> tokens = new ArrayList<>(rows.size());
        for (String[] row : rows) {
            List<List<String>> columns = new ArrayList<>(row.length);
            for (String text : row) {
                columns.add(tokenizer.tokenize(text == null ? "" : text));
            }
            tokens.add(columns);
        }
        return tokens;
    }

    /** The feature rows of {@code rows}, each with one text per column. */
    public SparseMatrix transform(List<String[]> rows) {
        return features.transform(tokenize(tokenizer, rows));
    }

    /**
     * How many tokens of a tokenized row the model cannot use: {@code [UNK]} pieces for WordPiece,
     * words that are not features for whole words.
     */
    public int unknownTokens(List<List<String>> row) {
        int unknown = 0;
        boolean wordPiece = spec.kind().equals(TokenizerSpec.WORDPIECE);
        for (int c = 0; c < row.size(); c++) {
            for (String token : row.get(c)) {
                boolean known = wordPiece
                        ? !token.equals(WordPieceVocabulary.UNK)
                        : features.indexOf(features.columns().get(c), token) >= 0;
                unknown += known ? 0 : 1;
            }
        }
        return unknown;
    }
}
