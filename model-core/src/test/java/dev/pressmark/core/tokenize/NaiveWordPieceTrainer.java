package dev.pressmark.core.tokenize;

import java.util.ArrayList;
import java.util.HashMap;
import java.util.HashSet;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.TreeSet;

/**
 * A slow, obviously correct WordPiece trainer to test {@link WordPieceTrainer} against: every
 * merge recounts every symbol and every pair of the whole word table from scratch and scans all
 * pairs for the best one at or above the frequency floor, lowering the floor one step at a time
 * while none qualifies. Same rules as the trainer's Javadoc, written independently: strings
 * instead of ids, no index, no queue, no jump to the largest count.
 */
final class NaiveWordPieceTrainer {

    private static final String PREFIX = "##";

    /** The outcome: the vocabulary and how many merges reused a token already present. */
    record Result(List<String> tokens, int reusedMerges) {
    }

    /** One word of the table: its current segmentation (mutable) and its count. */
    private record Word(List<String> symbols, long count) {
    }

    private record Pair(String left, String right) {
        String merged() {
            return left + right.substring(PREFIX.length());
        }
    }

    private NaiveWordPieceTrainer() {
    }

    /** The special tokens followed by the sorted alphabet of the trainable words. */
    static List<String> initialVocabulary(Map<String, Long> words, int maxWordChars) {
        Set<String> alphabet = new TreeSet<>();
        for (Word word : split(trainable(words, maxWordChars))) {
            alphabet.addAll(word.symbols());
        }
        List<String> tokens = new ArrayList<>(List.of("[PAD]", "[UNK]", "[CLS]", "[SEP]", "[MASK]"));
        tokens.addAll(alphabet);
        return tokens;
    }

    /**
     * Trains with a floor that starts at the largest initial pair count, capped at {@code
     * maxFirstFloor}, and falls to {@code floor(F * factor)} (by one at least) down to {@code
     * minFrequency} whenever no pair reaches it.
     */
    static Result train(Map<String, Long> words, int vocabSize, long minFrequency, int maxWordChars,
            long maxFirstFloor, double factor) {
        List<String> tokens = initialVocabulary(words, maxWordChars);
        Set<String> present = new HashSet<>(tokens);
        List<Word> table = split(trainable(words, maxWordChars));
        int reused = 0;
        long floor = -1;
        while (tokens.size() < vocabSize) {
            Map<String, Long> symbolCounts = new HashMap<>();
            Map<Pair, Long> pairCounts = new HashMap<>();
            for (Word word : table) {
                List<String> symbols = word.symbols();
                for (int i = 0; i < symbols.size(); i++) {
                    symbolCounts.merge(symbols.get(i), word.count(), Long::sum);
                    if (i + 1 < symbols.size()) {
                        pairCounts.merge(new Pair(symbols.get(i), symbols.get(i + 1)), word.count(), Long::sum);
                    }
                }
            }
            if (floor < 0) {
                long largest = 0;
                for (long count : pairCounts.values()) {
                    largest = Math.max(largest, count);
                }
                floor = Math.max(minFrequency, Math.min(largest, maxFirstFloor));
            }
            Pair best = best(pairCounts, symbolCounts, floor);
            while (best == null && floor > minFrequency) {
                floor = Math.max(minFrequency, Math.min(floor - 1, (long) Math.floor(floor * factor)));
                best = best(pairCounts, symbolCounts, floor);
            }
            if (best == null) {
                break;
            }
            String merged = best.merged();
            if (present.add(merged)) {
                tokens.add(merged);
            } else {
                reused++;
            }
            for (Word word : table) {
                List<String> symbols = word.symbols();
                List<String> out = new ArrayList<>(symbols.size());
                for (int i = 0; i < symbols.size(); i++) {
                    if (i + 1 < symbols.size() && symbols.get(i).equals(best.left())
                            && symbols.get(i + 1).equals(best.right())) {
                        out.add(merged);
                        i++;
                    } else {
                        out.add(symbols.get(i));
                    }
                }
                symbols.clear();
                symbols.addAll(out);
            }
        }
        return new Result(tokens, reused);
    }

    /** The best pair whose count is at least {@code floor}, or null. */
    private static Pair best(Map<Pair, Long> pairCounts, Map<String, Long> symbolCounts, long floor) {
        Pair best = null;
        double bestScore = 0;
        long bestCount = 0;
        for (Map.Entry<Pair, Long> entry : pairCounts.entrySet()) {
            Pair pair = entry.getKey();
            long count = entry.getValue();
            if (count < floor) {
                continue;
            }
            double score = (double) count
                    / ((double) symbolCounts.get(pair.left()) * (double) symbolCounts.get(pair.right()));
            if (best == null || score > bestScore
                    || score == bestScore && (count > bestCount
                            || count == bestCount && isBeforeOnTie(pair, best))) {
                best = pair;
                bestScore = score;
                bestCount = count;
            }
        }
        return best;
    }

    private static boolean isBeforeOnTie(Pair pair, Pair other) {
        int merged = pair.merged().compareTo(other.merged());
        return merged != 0 ? merged < 0 : pair.left().compareTo(other.left()) < 0;
    }

    private static Map<String, Long> trainable(Map<String, Long> words, int maxWordChars) {
        Map<String, Long> kept = new LinkedHashMap<>();
        words.forEach((word, count) -> {
            if (!word.startsWith(PREFIX) && word.codePointCount(0, word.length()) <= maxWordChars) {
                kept.put(word, count);
            }
        });
        return kept;
    }

    /** Each word as its alphabet symbols: the first code point as is, the others with ##. */
    private static List<Word> split(Map<String, Long> words) {
        List<Word> out = new ArrayList<>();
        words.forEach((word, count) -> {
            List<String> symbols = new ArrayList<>();
            word.codePoints().forEach(cp -> symbols.add(
                    (symbols.isEmpty() ? "" : PREFIX) + new String(Character.toChars(cp))));
            out.add(new Word(symbols, count));
        });
        return out;
    }
}
