package dev.pressmark.core.train;

import dev.pressmark.core.PressmarkException;
import dev.pressmark.core.Progress;
import dev.pressmark.core.bundle.TextPipeline;
import dev.pressmark.core.bundle.TokenizerSpec;
import dev.pressmark.core.feature.FeatureConfig;
import dev.pressmark.core.feature.FeatureSpace;
import dev.pressmark.core.feature.SparseMatrix;
import dev.pressmark.core.feature.ViewCaps;
import dev.pressmark.core.tokenize.Tokenizer;
import dev.pressmark.core.tokenize.ViewsTokenizer;
import dev.pressmark.core.tokenize.WordCounts;
import dev.pressmark.core.tokenize.WordPieceEncoder;
import dev.pressmark.core.tokenize.WordPieceTrainer;
import dev.pressmark.core.tokenize.WordPieceVocabulary;
import java.util.ArrayList;
import java.util.List;

/**
 * Fits the whole preprocessing, tokenizer vocabularies and feature space, from a set of training
 * rows only. Cross-validation calls it once per fold, so nothing of a fold's held-out rows reaches
 * a vocabulary, the token selection, the idf or the scaling.
 */
final class PipelineFitter {

    private final List<TokenizerConfig> tokenizers;
    private final FeatureConfig features;
    private final List<String> columns;

    PipelineFitter(List<TokenizerConfig> tokenizers, FeatureConfig features, List<String> columns) {
        this.tokenizers = List.copyOf(tokenizers);
        this.features = features;
        this.columns = List.copyOf(columns);
    }

    /** A fitted pipeline with the tokens and feature rows of the rows it was fitted on. */
    record Fitted(TextPipeline pipeline, List<List<List<String>>> tokens, SparseMatrix x) {
    }

    /** Fits on {@code rows}, each holding one text per column. */
    Fitted fit(List<String[]> rows, Progress progress) {
        List<TokenizerSpec> specs = new ArrayList<>(tokenizers.size());
        List<Tokenizer> built = new ArrayList<>(tokenizers.size());
        for (int v = 0; v < tokenizers.size(); v++) {
            TokenizerConfig view = tokenizers.get(v);
            TokenizerSpec spec = switch (view.kind()) {
                case WORD -> TokenizerSpec.words(TokenizerSpec.WORD, view.normalizer(), view.ngrams());
                case WORDS -> TokenizerSpec.words(TokenizerSpec.WORDS, view.normalizer(), view.ngrams());
                case CHAR_NGRAMS -> TokenizerSpec.charNgrams(view.normalizer(), view.minN(), view.maxN());
                case WORDPIECE -> TokenizerSpec.of(encoder(view, rows, v, progress), view.ngrams());
            };
            specs.add(spec);
            built.add(spec.tokenizer());
        }
        Tokenizer tokenizer = TextPipeline.combine(specs, built);
        List<List<List<String>>> tokens = TextPipeline.tokenize(tokenizer, rows);
        FeatureSpace space = features(features, tokenizer, tokens);
        return new Fitted(new TextPipeline(specs, tokenizer, space), tokens, space.transform(tokens));
    }

    /**
     * The feature space of {@code settings} on {@code tokens}, which this fitter's tokenizer gave:
     * what {@link #fit} fits after tokenizing, so that a search can fit several feature settings
     * on one tokenization.
     */
    FeatureSpace features(FeatureConfig settings, Tokenizer tokenizer, List<List<List<String>>> tokens) {
        return FeatureSpace.fit(settings, columns, tokens, caps(tokenizer));
    }

    private ViewCaps caps(Tokenizer tokenizer) {
        int[] caps = new int[tokenizers.size()];
        for (int v = 0; v < caps.length; v++) {
            caps[v] = tokenizers.get(v).maxTokens();
        }
        if (tokenizer instanceof ViewsTokenizer views) {
            return new ViewCaps(views::viewOf, caps);
        }
        return new ViewCaps(token -> 0, caps);
    }

    private static WordPieceEncoder encoder(TokenizerConfig view, List<String[]> rows, int index, Progress progress) {
        WordCounts counts = new WordCounts(view.normalizer());
        for (String[] row : rows) {
            for (String text : row) {
                counts.addText(text);
            }
        }
        WordPieceVocabulary vocabulary;
        try {
            vocabulary = new WordPieceTrainer(view.trainerConfig()).train(counts, progress);
        } catch (PressmarkException e) {
            // The trainer speaks of vocab_size; in a training run the key is tokenizer.vocab_size.
            String key = index == 0 ? "tokenizer." : "tokenizer." + index + ".";
            throw e.getMessage().startsWith("vocab_size") ? new PressmarkException(e.code(), key + e.getMessage(), e) : e;
        }
        return new WordPieceEncoder(vocabulary, view.normalizer(), view.maxWordChars());
    }
}
