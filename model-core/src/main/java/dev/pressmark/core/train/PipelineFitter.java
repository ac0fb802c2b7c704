package dev.pressmark.core.train;

import dev.pressmark.core.PressmarkException;
import dev.pressmark.core.Progress;
import dev.pressmark.core.bundle.TextPipeline;
import dev.pressmark.core.bundle.TokenizerSpec;
import dev.pressmark.core.feature.FeatureConfig;
import dev.pressmark.core.feature.FeatureSpace;
import dev.pressmark.core.feature.SparseMatrix;
import dev.pressmark.core.feature.TokenSource;
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

    /** A fitted pipeline with the feature rows of the rows it was fitted on. */
    record Fitted(TextPipeline pipeline, SparseMatrix x) {
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
                case CHAR_NGRAMS -> TokenizerSpec.charNgrams(view.normalizer(), view.minN(), view.maxN(),
                        view.whitespaceWords());
                case WORDPIECE -> TokenizerSpec.of(encoder(view, rows, v, progress), view.ngrams());
            };
            specs.add(spec);
            built.add(spec.tokenizer());
        }
        Tokenizer tokenizer = TextPipeline.combine(specs, built);
        return withFeatures(specs, built, tokenizer, features, rows);
    }

    /**
     * The feature space of {@code settings} on {@code rows} through the tokenizers of {@code
     * trained}, a pipeline this fitter fitted: a search fits further feature settings this way, so
     * that each fold's tokenizers are trained once.
     */
    Fitted withFeatures(TextPipeline trained, FeatureConfig settings, List<String[]> rows) {
        List<Tokenizer> built = new ArrayList<>(trained.views().size());
        for (TokenizerSpec spec : trained.views()) {
            built.add(spec.tokenizer());
        }
        return withFeatures(trained.views(), built, trained.tokenizer(), settings, rows);
    }

    /** What {@link #fit} does once the tokenizers are trained. */
    private Fitted withFeatures(List<TokenizerSpec> specs, List<Tokenizer> built, Tokenizer tokenizer, FeatureConfig settings,
            List<String[]> rows) {
        List<String> prefixes = TextPipeline.prefixes(tokenizer);
        TokenSource source = TextPipeline.source(built, rows);
        FeatureSpace space = FeatureSpace.fit(settings, columns, source, prefixes, caps());
        return new Fitted(new TextPipeline(specs, tokenizer, space), space.transform(source, prefixes));
    }

    private int[] caps() {
        int[] caps = new int[tokenizers.size()];
        for (int v = 0; v < caps.length; v++) {
            caps[v] = tokenizers.get(v).maxTokens();
        }
        return caps;
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
