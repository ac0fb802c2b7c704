package dev.pressmark.core.train;

import dev.pressmark.core.text.TextNormalizer;
import java.util.HashMap;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Map;
import java.util.Set;

/**
 * Which rows have identical texts, as the pipeline sees them: per row, the id of its normalised
 * text, numbered in the order texts first appear. A row's normalised text is, for each text
 * column, the column's text under each normaliser the tokenizer views use ({@code lowercase},
 * {@code strip_accents}, {@code cjk}), with runs of white space read as one space and white space
 * at either end left out: every tokenizer splits words at white space, so neither changes a token.
 * Two rows are identical when all of these agree.
 */
final class TextKeys {

    /** Joins fields and views; the normaliser removes every control character, so none occurs in its output. */
    private static final char SEPARATOR = '\u0000';

    private TextKeys() {
    }

    /** The distinct normalisers of {@code configs}' tokenizer views, in the order they first appear. */
    static List<TextNormalizer> normalizers(List<TrainConfig> configs) {
        Set<TextNormalizer> out = new LinkedHashSet<>();
        for (TrainConfig config : configs) {
            for (TokenizerConfig view : config.tokenizers()) {
                out.add(view.normalizer());
            }
        }
        return List.copyOf(out);
    }

    /** Per row of {@code texts}, the id of its normalised text under {@code normalizers}. */
    static int[] of(List<String[]> texts, List<TextNormalizer> normalizers) {
        int[] ids = new int[texts.size()];
        Map<String, Integer> known = new HashMap<>(texts.size() * 2);
        StringBuilder key = new StringBuilder(64);
        StringBuilder normalized = new StringBuilder(64);
        for (int i = 0; i < ids.length; i++) {
            key.setLength(0);
            for (TextNormalizer normalizer : normalizers) {
                for (String field : texts.get(i)) {
                    normalized.setLength(0);
                    normalizer.normalize(field, normalized);
                    appendCollapsed(normalized, key);
                    key.append(SEPARATOR);
                }
            }
            Integer id = known.putIfAbsent(key.toString(), known.size());
            ids[i] = id == null ? known.size() - 1 : id;
        }
        return ids;
    }

    /** Appends {@code text} with runs of spaces as one and none at either end. */
    private static void appendCollapsed(CharSequence text, StringBuilder out) {
        boolean pendingSpace = false;
        boolean any = false;
        for (int i = 0; i < text.length(); i++) {
            char c = text.charAt(i);
            if (c == ' ') {
                pendingSpace = any;
                continue;
            }
            if (pendingSpace) {
                out.append(' ');
                pendingSpace = false;
            }
            out.append(c);
            any = true;
        }
    }

    /** The number of distinct ids in {@code ids} (which number texts 0, 1, ... in order of first appearance). */
    static int count(int[] ids) {
        int max = -1;
        for (int id : ids) {
            max = Math.max(max, id);
        }
        return max + 1;
    }

    /** The row of each text's first appearance. */
    static int[] firstRows(int[] ids) {
        int[] first = new int[count(ids)];
        java.util.Arrays.fill(first, -1);
        for (int i = 0; i < ids.length; i++) {
            if (first[ids[i]] < 0) {
                first[ids[i]] = i;
            }
        }
        return first;
    }
}
