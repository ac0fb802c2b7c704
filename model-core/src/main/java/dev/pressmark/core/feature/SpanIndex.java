package dev.pressmark.core.feature;

import java.util.Map;

/**
 * A frozen map from token strings to feature indices that is looked up by a span of characters,
 * so that a token found inside a larger text (an n-gram of a word, a word of a line) needs no
 * string of its own. Open addressing with linear probing over {@link String#hashCode()}'s
 * polynomial, computed over the span; a hit is confirmed character by character. Immutable and
 * thread-safe.
 *
 * <p>Laid out for the scoring path, where a character n-gram model looks up a hundred or more
 * spans per row: each slot keeps the key's hash, value, offset and length side by side in one
 * {@code int} array, and the keys' characters sit end to end in one {@code char} array, so a hit
 * reads one line of the table and one of the characters, with no {@code String} object (and its
 * array) to chase; a key's characters are read only when the hashes agree.
 * The slot comes from the hash times a large odd constant (Fibonacci hashing, Knuth, TAOCP vol. 3,
 * 6.4), not from its low bits: the polynomial hashes of short n-grams are small, nearby numbers,
 * which taken by their low bits fill runs of adjacent slots and make probe chains long.
 */
public final class SpanIndex {

    /** What {@link #get} returns for a span that is no key. */
    public static final int MISSING = -1;

    /** 2^32 divided by the golden ratio, odd: spreads nearby hashes over the whole table. */
    private static final int FIBONACCI = 0x9E3779B9;

    /** Ints per slot: the key's hash, its value ({@link #MISSING} in an empty slot), its offset in {@link #chars} and its length. */
    private static final int STRIDE = 4;

    private final int[] slots;
    /** Every key's characters, end to end. */
    private final char[] chars;
    /** 32 less the table's bit count: the shift that takes a slot from the top bits of the product. */
    private final int shift;
    private final int mask;

    /** The index of these entries; values must be &gt;= 0. */
    public SpanIndex(Map<String, Integer> entries) {
        int bits = Math.max(2, 32 - Integer.numberOfLeadingZeros(Math.max(1, entries.size() * 2 - 1)));
        int capacity = 1 << bits;
        slots = new int[STRIDE * capacity];
        long total = 0;
        for (String key : entries.keySet()) {
            total += key.length();
        }
        if (total > Integer.MAX_VALUE - 8) {
            throw new IllegalArgumentException("the keys must hold at most " + (Integer.MAX_VALUE - 8) + " chars in all, held " + total);
        }
        chars = new char[(int) total];
        shift = 32 - bits;
        mask = capacity - 1;
        for (int slot = 0; slot < capacity; slot++) {
            slots[STRIDE * slot + 1] = MISSING;
        }
        int used = 0;
        for (Map.Entry<String, Integer> entry : entries.entrySet()) {
            put(entry.getKey(), entry.getValue(), used);
            used += entry.getKey().length();
        }
    }

    /** Puts {@code key} in its slot, its characters at {@code offset} of {@link #chars}. */
    private void put(String key, int value, int offset) {
        if (value < 0) {
            throw new IllegalArgumentException("values must be >= 0, was " + value + " for \"" + key + "\"");
        }
        int hash = key.hashCode();
        int slot = slotOf(hash);
        while (slots[STRIDE * slot + 1] != MISSING) {
            slot = (slot + 1) & mask;
        }
        int at = STRIDE * slot;
        slots[at] = hash;
        slots[at + 1] = value;
        slots[at + 2] = offset;
        slots[at + 3] = key.length();
        key.getChars(0, key.length(), chars, offset);
    }

    /** The value of the key {@code text[start, end)}, or {@link #MISSING}. */
    public int get(CharSequence text, int start, int end) {
        int hash = 0;
        for (int i = start; i < end; i++) {
            hash = 31 * hash + text.charAt(i);
        }
        for (int slot = slotOf(hash); ; slot = (slot + 1) & mask) {
            int at = STRIDE * slot;
            int value = slots[at + 1];
            if (value == MISSING) {
                return MISSING;
            }
            if (slots[at] == hash && slots[at + 3] == end - start && same(slots[at + 2], text, start, end)) {
                return value;
            }
        }
    }

    private boolean same(int offset, CharSequence text, int start, int end) {
        for (int i = start, k = offset; i < end; i++, k++) {
            if (chars[k] != text.charAt(i)) {
                return false;
            }
        }
        return true;
    }

    private int slotOf(int hash) {
        return (hash * FIBONACCI) >>> shift;
    }
}
