package dev.pressmark.core.train;

import dev.pressmark.core.PressmarkException;
import dev.pressmark.core.Progress;
import dev.pressmark.core.bundle.TextPipeline;
import dev.pressmark.core.bundle.TokenizerSpec;
import dev.pressmark.core.feature.FeatureConfig;
import dev.pressmark.core.feature.FeatureSpace;
import dev.pressmark.core.feature.SparseMatrix;
import dev.pressmark.core.tokenize.Tokenizer;
import dev.pressmark.core.tokenize.WordCounts;
import dev.pressmark.core.tokenize.WordPieceEncoder;
import dev.pressmark.core.tokenize.WordPieceTrainer;
import dev.pressmark.core.tokenize.WordPieceVocabulary;
import java.util.List;

/**
 * Fits the whole preprocessing, tokenizer vocabulary and feature space, from a set of training
 * rows only. Cross-validation calls it once per fold, so nothing of a fold's held-out rows reaches
 * the vocabulary, the token selection, the idf or the scaling.
 */
final class PipelineFitter {

    private final TokenizerConfig tokenizer;
    private final FeatureConfig features;
    private final List<String> columns;

    PipelineFitter(TokenizerConfig tokenizer, FeatureConfig features, List<String> columns) {
        this.tokenizer = tokenizer;
        this.features = features;
        this.columns = List.copyOf(columns);
    }

    /** A fitted pipeline with the tokens and feature rows of the rows it was fitted on. */
    record Fitted(TextPipeline pipeline, List<List<List<String>>> tokens, SparseMatrix x) {
    }

    /** Fits on {@code rows}, each holding one text per column. */
    Fitted fit(List<String[]> rows, Progress progress) {
        TokenizerSpec spec;
        Tokenizer fitted;
        if (tokenizer.kind() == TokenizerKind.WORD) {
            spec = TokenizerSpec.words(tokenizer.normalizer());
            fitted = spec.tokenizer();
        } else {
            WordCounts counts = new WordCounts(tokenizer.normalizer());
            for (String[] row : rows) {
                for (String text : row) {
                    counts.addText(text);
                }
            }
            WordPieceVocabulary vocabulary;
            try {
                vocabulary = new WordPieceTrainer(tokenizer.trainerConfig()).train(counts, progress);
            } catch (PressmarkException e) {
                // The trainer speaks of vocab_size; in a training run the key is tokenizer.vocab_size.
                throw e.getMessage().startsWith("vocab_size") ? new PressmarkException(e.code(), "tokenizer." + e.getMessage(), e) : e;
            }
            WordPieceEncoder encoder = new WordPieceEncoder(vocabulary, tokenizer.normalizer(), tokenizer.maxWordChars());
            spec = TokenizerSpec.of(encoder);
            fitted = encoder;
        }
        List<List<List<String>>> tokens = TextPipeline.tokenize(fitted, rows);
        FeatureSpace space = FeatureSpace.fit(features, columns, tokens);
        return new Fitted(new TextPipeline(spec, fitted, space), tokens, space.transform(tokens));
    }
}
