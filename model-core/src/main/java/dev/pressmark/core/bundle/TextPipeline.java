package dev.pressmark.core.bundle;

import dev.pressmark.core.feature.FeatureSpace;
import dev.pressmark.core.feature.SparseMatrix;
import dev.pressmark.core.tokenize.CharNgramTokenizer;
import dev.pressmark.core.tokenize.Tokenizer;
import dev.pressmark.core.tokenize.ViewsTokenizer;
import dev.pressmark.core.tokenize.WordPieceEncoder;
import dev.pressmark.core.tokenize.WordPieceVocabulary;
import dev.pressmark.core.feature.SpanIndex;
import dev.pressmark.core.feature.TokenSource;
import java.util.ArrayList;
import java.util.List;
import java.util.Objects;

/**
 * The frozen preprocessing of a model: one or more views of every text column (each a tokenizer)
 * and the fitted feature space over their tokens. Training builds one per fold and one for the
 * final model; serving rebuilds the final one from the bundle, so both apply exactly the same
 * steps. With several views, every token carries its view's tag ({@link ViewsTokenizer}). Immutable
 * and thread-safe; a {@link RowEncoder} is not, so each thread takes its own.
 */
public final class TextPipeline {

    private final List<TokenizerSpec> views;
    private final Tokenizer tokenizer;
    private final FeatureSpace features;
    /** The tables a row encoder looks features up in; built once, on first use. */
    private volatile Lookups lookups;
    private final Object lookupsLock = new Object();

    /**
     * @param index per text column and view, the features of that view's tokens
     * @param featureOfId per text column and WordPiece view, the feature of each vocabulary id
     */
    private record Lookups(SpanIndex[][] index, int[][][] featureOfId) {
    }

    public TextPipeline(List<TokenizerSpec> views, Tokenizer tokenizer, FeatureSpace features) {
        this.views = List.copyOf(views);
        if (this.views.isEmpty()) {
            throw new IllegalArgumentException("a text pipeline needs at least one view");
        }
        this.tokenizer = Objects.requireNonNull(tokenizer, "tokenizer");
        this.features = Objects.requireNonNull(features, "features");
    }

    public List<TokenizerSpec> views() {
        return views;
    }

    public Tokenizer tokenizer() {
        return tokenizer;
    }

    public FeatureSpace features() {
        return features;
    }

    /** A new encoder of rows of text straight into feature rows; for one thread at a time. */
    public RowEncoder rowEncoder() {
        List<Tokenizer> viewTokenizers = viewTokenizers();
        Lookups tables = lookups(viewTokenizers);
        boolean[] wordPiece = new boolean[views.size()];
        for (int v = 0; v < wordPiece.length; v++) {
            wordPiece[v] = views.get(v).isWordPiece();
        }
        return new RowEncoder(features.encoder(), viewTokenizers, tables.index(), tables.featureOfId(), wordPiece);
    }

    /** The lookup tables, built by the first caller; threads that ask meanwhile wait rather than build them again. */
    private Lookups lookups(List<Tokenizer> viewTokenizers) {
        Lookups built = lookups;
        if (built == null) {
            synchronized (lookupsLock) {
                built = lookups;
                if (built == null) {
                    SpanIndex[][] index = buildSpanIndex();
                    built = new Lookups(index, featuresOfIds(viewTokenizers, index));
                    lookups = built;
                }
            }
        }
        return built;
    }

    /**
     * Per text column and view, for each view that is a WordPiece encoder itself (not n-grams of
     * its pieces), the feature of each vocabulary id: what the
     * span index gives for the id's token ({@link SpanIndex#MISSING} for a token the features left
     * out); null for the other views.
     */
    private static int[][][] featuresOfIds(List<Tokenizer> viewTokenizers, SpanIndex[][] index) {
        int[][][] ids = new int[index.length][viewTokenizers.size()][];
        for (int c = 0; c < index.length; c++) {
            for (int v = 0; v < viewTokenizers.size(); v++) {
                if (viewTokenizers.get(v) instanceof WordPieceEncoder wordPiece) {
                    WordPieceVocabulary vocabulary = wordPiece.vocabulary();
                    int[] features = new int[vocabulary.size()];
                    for (int id = 0; id < features.length; id++) {
                        String token = vocabulary.token(id);
                        features[id] = index[c][v].get(token, 0, token.length());
                    }
                    ids[c][v] = features;
                }
            }
        }
        return ids;
    }

    private SpanIndex[][] buildSpanIndex() {
        return features.spanIndex(prefixes());
    }

    /** Per view, what its tokens carry in front in the feature space: its tag, or nothing for a single view. */
    public List<String> prefixes() {
        return prefixes(tokenizer);
    }

    /** Per view of {@code tokenizer}, what its tokens carry in front in a feature space. */
    public static List<String> prefixes(Tokenizer tokenizer) {
        if (tokenizer instanceof ViewsTokenizer tagged) {
            List<String> prefixes = new ArrayList<>(tagged.tags().size());
            tagged.tags().forEach(tag -> prefixes.add(tag + ViewsTokenizer.SEPARATOR));
            return prefixes;
        }
        return List.of("");
    }

    /** The tokenizer of each view, untagged. */
    public List<Tokenizer> viewTokenizers() {
        return tokenizer instanceof ViewsTokenizer tagged ? tagged.views() : List.of(tokenizer);
    }

    /** {@code rows} (one text per column) as the views scan them, for fitting and transforming without token lists. */
    public static TokenSource source(List<Tokenizer> viewTokenizers, List<String[]> rows) {
        return new TokenSource() {
            @Override
            public int rows() {
                return rows.size();
            }

            @Override
            public void scan(int row, int column, Sink sink) {
                String text = rows.get(row)[column];
                for (int v = 0; v < viewTokenizers.size(); v++) {
                    int view = v;
                    viewTokenizers.get(v).scan(text == null ? "" : text, Integer.MAX_VALUE,
                            (chars, start, end) -> sink.token(view, chars, start, end));
                }
            }
        };
    }

    /** A pipeline of one view. */
    public TextPipeline(TokenizerSpec spec, Tokenizer tokenizer, FeatureSpace features) {
        this(List.of(spec), tokenizer, features);
    }

    /** The tokenizer of these views, already built one by one: the view itself, or all of them tagged. */
    public static Tokenizer combine(List<TokenizerSpec> views, List<Tokenizer> built) {
        if (views.size() == 1) {
            return built.get(0);
        }
        List<String> names = new ArrayList<>(views.size());
        views.forEach(view -> names.add(view.shortName()));
        return new ViewsTokenizer(built, ViewsTokenizer.tags(names));
    }

    /** The tokenizer of these views, built from their specs. */
    public static Tokenizer tokenizer(List<TokenizerSpec> views) {
        List<Tokenizer> built = new ArrayList<>(views.size());
        views.forEach(view -> built.add(view.tokenizer()));
        return combine(views, built);
    }

    /** The text columns, in the order rows list them. */
    public List<String> columns() {
        return features.columns();
    }

    /** True when a bundle of format 1 can hold this pipeline. */
    public boolean fitsFormat1() {
        return views.size() == 1 && views.get(0).fitsFormat1() && features.fitsFormat1();
    }

    /** The tokens of each column of each row. */
    public static List<List<List<String>>> tokenize(Tokenizer tokenizer, List<String[]> rows) {
        return tokenize(tokenizer, rows, Integer.MAX_VALUE).rows();
    }

    /**
     * The tokens of rows with each field cut to its first {@code maxTokensPerField} tokens (of each
     * view), and how many were cut from each row.
     */
    public record Tokens(List<List<List<String>>> rows, int[] dropped) {
    }

    /** The tokens of each column of each row, each field of each view cut to {@code maxTokensPerField}. */
    public static Tokens tokenize(Tokenizer tokenizer, List<String[]> rows, int maxTokensPerField) {
        List<List<List<String>>> tokens = new ArrayList<>(rows.size());
        int[] dropped = new int[rows.size()];
        int[] count = new int[1];
        for (int i = 0; i < rows.size(); i++) {
            String[] row = rows.get(i);
            List<List<String>> columns = new ArrayList<>(row.length);
            count[0] = 0;
            for (String text : row) {
                columns.add(tokenizer.tokenize(text == null ? "" : text, maxTokensPerField, count));
            }
            dropped[i] = count[0];
            tokens.add(columns);
        }
        return new Tokens(tokens, dropped);
    }

    /** The feature rows of {@code rows}, each with one text per column. */
    public SparseMatrix transform(List<String[]> rows) {
        return features.transform(source(viewTokenizers(), rows), prefixes());
    }

    /**
     * How many tokens of a tokenized row the model cannot use: {@code [UNK]} pieces of a WordPiece
     * view, tokens of the other views that are not features.
     */
    public int unknownTokens(List<List<String>> row) {
        int unknown = 0;
        ViewsTokenizer tagged = tokenizer instanceof ViewsTokenizer v ? v : null;
        for (int c = 0; c < row.size(); c++) {
            for (String token : row.get(c)) {
                int view = tagged == null ? 0 : tagged.viewOf(token);
                boolean known;
                if (view >= 0 && views.get(view).isWordPiece()) {
                    int from = prefixLength(tagged, view);
                    known = !(token.length() - from == WordPieceVocabulary.UNK.length()
                            && token.startsWith(WordPieceVocabulary.UNK, from));
                } else {
                    known = features.indexOf(features.columns().get(c), token) >= 0;
                }
                unknown += known ? 0 : 1;
            }
        }
        return unknown;
    }

    private static int prefixLength(ViewsTokenizer tagged, int view) {
        return tagged == null ? 0 : tagged.tags().get(view).length() + 1;
    }

    /**
     * The text a feature's token stands for, fit to write into an example input: the token without
     * its view's tag; for character n-grams only a whole marked word ({@code <kit>} gives
     * {@code kit}), else null.
     */
    public String exampleText(String token) {
        int view = 0;
        String raw = token;
        if (tokenizer instanceof ViewsTokenizer tagged) {
            view = tagged.viewOf(token);
            if (view < 0) {
                return null;
            }
            raw = token.substring(tagged.tags().get(view).length() + 1);
        }
        if (!views.get(view).kind().equals(TokenizerSpec.CHAR_NGRAMS)) {
            return raw;
        }
        boolean wholeWord = raw.length() > 2 && raw.charAt(0) == CharNgramTokenizer.START
                && raw.charAt(raw.length() - 1) == CharNgramTokenizer.END;
        return wholeWord ? raw.substring(1, raw.length() - 1) : null;
    }

    /** The number of WordPiece vocabulary entries over all views. */
    public int vocabularySize() {
        int size = 0;
        for (TokenizerSpec view : views) {
            size += view.vocabulary() == null ? 0 : view.vocabulary().size();
        }
        return size;
    }
}
