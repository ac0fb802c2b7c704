package dev.pressmark.core.feature;

import java.util.Map;

/**
 * A frozen map from token strings to feature indices that is looked up by a span of characters,
 * so that a token found inside a larger text (an n-gram of a word, a word of a line) needs no
 * string of its own. Immutable and thread-safe.
 *
 * <p>Laid out for the scoring path, where a character n-gram model looks up a hundred or more
 * spans per row, and in two tables by key length:
 * <ul>
 * <li>A short key (up to {@value #SHORT} chars: every character 1- to 4-gram, many words) is
 * coded into one {@code int}: each char of the short keys' alphabet gets a code from 1 up, and the
 * codes of a key's chars, {@code b} bits each, the first highest, make its code. As no char codes to
 * 0, the code's length in bits gives the key's length, so no two keys share a code. Slots hold the
 * code beside the value, 8 bytes a slot: a probe reads one cache line, and the table is a quarter
 * of one that holds characters elsewhere. A span with a char outside the alphabet is no key, known
 * before any probe. With an alphabet too large for {@value #SHORT} codes in 32 bits, the short keys
 * are those of {@code 32 / b} chars.
 * <li>A longer key keeps its {@link String#hashCode()} polynomial, value, offset and length side by
 * side in one {@code int} array, its characters end to end in one {@code char} array, read only when
 * the hashes agree.
 * </ul>
 * Both use open addressing with linear probing, at most half full. The slot comes from the code or
 * hash times a large odd constant (Fibonacci hashing, Knuth, TAOCP vol. 3, 6.4), not from its low
 * bits: short n-grams code and hash to nearby numbers, which taken by their low bits fill runs of
 * adjacent slots and make probe chains long.
 */
public final class SpanIndex {

    /** What {@link #get} returns for a span that is no key. */
    public static final int MISSING = -1;

    /** The longest key, in chars, that is coded into an {@code int}. */
    static final int SHORT = 4;

    /** 2^32 divided by the golden ratio, odd: spreads nearby hashes over the whole table. */
    private static final int FIBONACCI = 0x9E3779B9;

    /** Ints per short slot: the key's code (0 in an empty slot), then its value. */
    private static final int SHORT_STRIDE = 2;

    /** Ints per long slot: the key's hash, its value ({@link #MISSING} in an empty slot), its offset in {@link #chars} and its length. */
    private static final int STRIDE = 4;

    /** Per char, its code in the short keys' alphabet, 0 for a char outside it; as long as the alphabet's largest char + 1. */
    private final int[] codes;
    /** Bits per char code. */
    private final int codeBits;
    /** Keys of at most this many chars are short. */
    private final int shortLength;
    private final int[] shortSlots;
    /** 32 less the short table's bit count. */
    private final int shortShift;
    private final int shortMask;
    /** The value of the empty key, or {@link #MISSING}. */
    private final int emptyValue;

    private final int[] slots;
    /** Every long key's characters, end to end. */
    private final char[] chars;
    /** 32 less the long table's bit count: the shift that takes a slot from the top bits of the product. */
    private final int shift;
    private final int mask;

    /** The index of these entries; values must be &gt;= 0. */
    public SpanIndex(Map<String, Integer> entries) {
        int maxChar = 0;
        for (Map.Entry<String, Integer> entry : entries.entrySet()) {
            String key = entry.getKey();
            int value = entry.getValue();
            if (value < 0) {
                throw new IllegalArgumentException("values must be >= 0, was " + value + " for \"" + key + "\"");
            }
            for (int i = 0; key.length() <= SHORT && i < key.length(); i++) {
                maxChar = Math.max(maxChar, key.charAt(i));
            }
        }
        codes = new int[maxChar + 1];
        int alphabet = 0;
        for (String key : entries.keySet()) {
            for (int i = 0; key.length() <= SHORT && i < key.length(); i++) {
                if (codes[key.charAt(i)] == 0) {
                    codes[key.charAt(i)] = ++alphabet;
                }
            }
        }
        codeBits = 32 - Integer.numberOfLeadingZeros(Math.max(1, alphabet));
        shortLength = Math.min(SHORT, Integer.SIZE / codeBits);
        int shortKeys = 0;
        long total = 0;
        int empty = MISSING;
        for (Map.Entry<String, Integer> entry : entries.entrySet()) {
            int length = entry.getKey().length();
            if (length == 0) {
                empty = entry.getValue();
            } else if (length <= shortLength) {
                shortKeys++;
            } else {
                total += length;
            }
        }
        if (total > Integer.MAX_VALUE - 8) {
            throw new IllegalArgumentException("the keys must hold at most " + (Integer.MAX_VALUE - 8) + " chars in all, held " + total);
        }
        emptyValue = empty;
        int shortBits = bitsFor(shortKeys);
        shortSlots = new int[SHORT_STRIDE << shortBits];
        shortShift = 32 - shortBits;
        shortMask = (1 << shortBits) - 1;
        int longKeys = entries.size() - shortKeys - (empty == MISSING ? 0 : 1);
        int bits = bitsFor(longKeys);
        slots = new int[STRIDE << bits];
        chars = new char[(int) total];
        shift = 32 - bits;
        mask = (1 << bits) - 1;
        for (int at = 1; at < slots.length; at += STRIDE) {
            slots[at] = MISSING;
        }
        int used = 0;
        for (Map.Entry<String, Integer> entry : entries.entrySet()) {
            String key = entry.getKey();
            if (key.isEmpty()) {
                continue;
            }
            if (key.length() <= shortLength) {
                putShort(code(key, 0, key.length()), entry.getValue());
            } else {
                putLong(key, entry.getValue(), used);
                used += key.length();
            }
        }
    }

    /** The bit count of a table at most half full with {@code keys} keys, at least 2. */
    private static int bitsFor(int keys) {
        return Math.max(2, 32 - Integer.numberOfLeadingZeros(Math.max(1, keys * 2 - 1)));
    }

    private void putShort(int code, int value) {
        int slot = shortSlotOf(code);
        while (shortSlots[SHORT_STRIDE * slot] != 0) {
            slot = (slot + 1) & shortMask;
        }
        shortSlots[SHORT_STRIDE * slot] = code;
        shortSlots[SHORT_STRIDE * slot + 1] = value;
    }

    /** Puts {@code key} in its slot, its characters at {@code offset} of {@link #chars}. */
    private void putLong(String key, int value, int offset) {
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
        int length = end - start;
        if (length > shortLength) {
            return getLong(text, start, end);
        }
        if (length == 0) {
            return emptyValue;
        }
        int code = code(text, start, end);
        return code == 0 ? MISSING : getShort(code);
    }

    private int getShort(int code) {
        for (int slot = shortSlotOf(code); ; slot = (slot + 1) & shortMask) {
            int at = SHORT_STRIDE * slot;
            int found = shortSlots[at];
            if (found == code) {
                return shortSlots[at + 1];
            }
            if (found == 0) {
                return MISSING;
            }
        }
    }

    private int getLong(CharSequence text, int start, int end) {
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

    /**
     * The code of {@code text[start, end)}, 1 to {@link #shortLength} chars: their char codes,
     * {@link #codeBits} each, the first highest; 0 when a char is outside the alphabet.
     */
    private int code(CharSequence text, int start, int end) {
        int code = 0;
        for (int i = start; i < end; i++) {
            char c = text.charAt(i);
            int charCode = c < codes.length ? codes[c] : 0;
            if (charCode == 0) {
                return 0;
            }
            code = code << codeBits | charCode;
        }
        return code;
    }

    private boolean same(int offset, CharSequence text, int start, int end) {
        for (int i = start, k = offset; i < end; i++, k++) {
            if (chars[k] != text.charAt(i)) {
                return false;
            }
        }
        return true;
    }

    private int shortSlotOf(int code) {
        return (code * FIBONACCI) >>> shortShift;
    }

    private int slotOf(int hash) {
        return (hash * FIBONACCI) >>> shift;
    }
}
