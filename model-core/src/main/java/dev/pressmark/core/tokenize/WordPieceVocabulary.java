package dev.pressmark.core.tokenize;

import dev.pressmark.core.PressmarkException;
import dev.pressmark.core.io.AtomicFiles;
import dev.pressmark.core.io.Utf8Lines;
import java.io.BufferedWriter;
import java.io.OutputStreamWriter;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Collections;
import java.util.HashMap;
import java.util.List;
import java.util.Map;

/**
 * An immutable WordPiece vocabulary: token strings and their ids (the position in the list).
 * Tokens that continue a word carry the {@link #CONTINUATION_PREFIX}. The file form is one token
 * a line, UTF-8, in id order, the special tokens first.
 */
public final class WordPieceVocabulary {

    public static final String PAD = "[PAD]";
    public static final String UNK = "[UNK]";
    public static final String CLS = "[CLS]";
    public static final String SEP = "[SEP]";
    public static final String MASK = "[MASK]";
    /** The special tokens, in the order a trained vocabulary starts with. */
    public static final List<String> SPECIAL_TOKENS = List.of(PAD, UNK, CLS, SEP, MASK);
    /** Marks a token that continues a word rather than starting one. */
    public static final String CONTINUATION_PREFIX = "##";

    private final List<String> tokens;
    private final Map<String, Integer> ids;
    private final int unkId;

    private WordPieceVocabulary(List<String> tokens, Map<String, Integer> ids) {
        this.tokens = tokens;
        this.ids = ids;
        this.unkId = ids.get(UNK);
    }

    /**
     * A vocabulary of {@code tokens}, in id order. Refuses blank or duplicate tokens and a list
     * without {@value #UNK}, naming the 1-based position as the line.
     */
    public static WordPieceVocabulary of(List<String> tokens) {
        return build(tokens, "vocabulary");
    }

    /** Reads a vocabulary file; errors name the file and the line. */
    public static WordPieceVocabulary read(Path file) {
        List<String> tokens = new ArrayList<>();
        Utf8Lines.forEach(file, (line, number) -> tokens.add(line));
        return build(tokens, file.toString());
    }

    /** Writes the vocabulary file atomically: the complete file or nothing. */
    public void write(Path file) {
        AtomicFiles.write(file, out -> {
            BufferedWriter writer = new BufferedWriter(new OutputStreamWriter(out, StandardCharsets.UTF_8));
            for (String token : tokens) {
                writer.write(token);
                writer.write('\n');
            }
            writer.flush();
        });
    }

    private static WordPieceVocabulary build(List<String> tokens, String source) {
        Map<String, Integer> ids = new HashMap<>(tokens.size() * 2);
        for (int i = 0; i < tokens.size(); i++) {
            String token = tokens.get(i);
            int line = i + 1;
            if (token == null || token.isBlank()) {
                throw invalid(source, line, "blank token; every line must hold one token");
            }
            if (!token.strip().equals(token)) {
                throw invalid(source, line, "token \"" + token + "\" has leading or trailing whitespace");
            }
            if (token.equals(CONTINUATION_PREFIX)) {
                throw invalid(source, line, "token \"##\" is only the continuation prefix");
            }
            Integer previous = ids.putIfAbsent(token, i);
            if (previous != null) {
                throw invalid(source, line, "duplicate token \"" + token + "\", first on line " + (previous + 1));
            }
        }
        if (!ids.containsKey(UNK)) {
            throw new PressmarkException("invalid-vocabulary",
                    source + ": no " + UNK + " token; a vocabulary needs one for words it cannot cover");
        }
        return new WordPieceVocabulary(Collections.unmodifiableList(new ArrayList<>(tokens)), ids);
    }

    private static PressmarkException invalid(String source, int line, String what) {
        return new PressmarkException("invalid-vocabulary", source + ": line " + line + ": " + what);
    }

    public int size() {
        return tokens.size();
    }

    /** The token with id {@code id}. */
    public String token(int id) {
        return tokens.get(id);
    }

    /** The id of {@code token}, or -1 when it is not in the vocabulary. */
    public int id(String token) {
        Integer id = ids.get(token);
        return id == null ? -1 : id;
    }

    public int unkId() {
        return unkId;
    }

    /** All tokens in id order, unmodifiable. */
    public List<String> tokens() {
        return tokens;
    }

    @Override
    public boolean equals(Object other) {
        return other instanceof WordPieceVocabulary v && v.tokens.equals(tokens);
    }

    @Override
    public int hashCode() {
        return tokens.hashCode();
    }

    @Override
    public String toString() {
        return "WordPieceVocabulary[" + tokens.size() + " tokens]";
    }
}
