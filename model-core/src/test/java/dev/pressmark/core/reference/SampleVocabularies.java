package dev.pressmark.core.reference;

import dev.pressmark.core.text.TextNormalizer;
import dev.pressmark.core.tokenize.WordCounts;
import dev.pressmark.core.tokenize.WordPieceVocabulary;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Map;
import java.util.Set;

/**
 * Vocabularies for the differential tests that do not depend on our trainer: whole frequent words,
 * frequent word endings in {@code ##} form, and most, but deliberately not all, single characters,
 * so that some words cannot be covered and must become [UNK].
 */
public final class SampleVocabularies {

    private SampleVocabularies() {
    }

    /** A vocabulary drawn from the frequencies of {@code texts}. */
    public static WordPieceVocabulary fromTexts(List<String> texts, int words, int endings) {
        WordCounts counts = new WordCounts(TextNormalizer.DEFAULT);
        texts.forEach(counts::addText);
        Map<String, long[]> initial = new HashMap<>();
        Map<String, long[]> continuation = new HashMap<>();
        Map<String, long[]> suffixes = new HashMap<>();
        List<Map.Entry<String, Long>> byCount = new ArrayList<>();
        counts.forEachSorted((word, count) -> {
            byCount.add(Map.entry(word, count));
            int first = Character.charCount(word.codePointAt(0));
            initial.computeIfAbsent(word.substring(0, first), k -> new long[1])[0] += count;
            for (int i = first; i < word.length(); ) {
                int cp = word.codePointAt(i);
                continuation.computeIfAbsent("##" + new String(Character.toChars(cp)), k -> new long[1])[0] += count;
                i += Character.charCount(cp);
            }
            for (int length = 2; length <= 5 && length < word.length(); length++) {
                suffixes.computeIfAbsent("##" + word.substring(word.length() - length), k -> new long[1])[0] += count;
            }
        });
        Set<String> tokens = new LinkedHashSet<>(WordPieceVocabulary.SPECIAL_TOKENS);
        // Characters seen only once are left out: words holding them cannot be covered.
        addAboveCount(tokens, initial, 2, Integer.MAX_VALUE);
        addAboveCount(tokens, continuation, 2, Integer.MAX_VALUE);
        byCount.sort((a, b) -> Long.compare(b.getValue(), a.getValue()) != 0
                ? Long.compare(b.getValue(), a.getValue()) : a.getKey().compareTo(b.getKey()));
        for (int i = 0; i < Math.min(words, byCount.size()); i++) {
            tokens.add(byCount.get(i).getKey());
        }
        addAboveCount(tokens, suffixes, 1, endings);
        return WordPieceVocabulary.of(new ArrayList<>(tokens));
    }

    private static void addAboveCount(Set<String> tokens, Map<String, long[]> counts, long min, int limit) {
        List<Map.Entry<String, long[]>> entries = new ArrayList<>(counts.entrySet());
        entries.sort((a, b) -> Long.compare(b.getValue()[0], a.getValue()[0]) != 0
                ? Long.compare(b.getValue()[0], a.getValue()[0]) : a.getKey().compareTo(b.getKey()));
        int added = 0;
        for (Map.Entry<String, long[]> entry : entries) {
            if (entry.getValue()[0] >= min && added < limit) {
                tokens.add(entry.getKey());
                added++;
            }
        }
    }
}
