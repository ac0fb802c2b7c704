package dev.pressmark.core.feature;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.SplittableRandom;
import net.jqwik.api.Arbitraries;
import net.jqwik.api.Arbitrary;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.Provide;
import net.jqwik.api.constraints.IntRange;
import org.junit.jupiter.api.Test;

/** The span lookup answers as a {@link HashMap} over the span's own string does (the JDK's map is the reference). */
class SpanIndexTest {

    @Provide
    Arbitrary<List<String>> keys() {
        // short strings over a few letters and the word marks: the nearby hashes of character n-grams, with collisions
        return Arbitraries.strings().withChars("ab<>\u00e9\u4e2d").ofMinLength(0).ofMaxLength(5).list().ofMaxSize(200);
    }

    @Provide
    Arbitrary<String> texts() {
        return Arbitraries.strings().withChars("ab<>\u00e9\u4e2dz").ofMaxLength(12);
    }

    @Property(tries = 300)
    void every_span_of_a_text_gives_what_a_hash_map_gives_for_its_string(@ForAll("keys") List<String> keys, @ForAll("texts") String text) {
        Map<String, Integer> entries = new HashMap<>();
        for (String key : keys) {
            entries.putIfAbsent(key, entries.size());
        }
        SpanIndex index = new SpanIndex(entries);
        for (int start = 0; start <= text.length(); start++) {
            for (int end = start; end <= text.length(); end++) {
                int expected = entries.getOrDefault(text.substring(start, end), SpanIndex.MISSING);
                assertThat(index.get(text, start, end)).as("span [%d, %d) of \"%s\"", start, end, text).isEqualTo(expected);
            }
        }
        for (Map.Entry<String, Integer> entry : entries.entrySet()) {
            assertThat(index.get(entry.getKey(), 0, entry.getKey().length())).isEqualTo(entry.getValue());
        }
    }

    @Provide
    Arbitrary<List<String>> oddKeys() {
        // lengths 0 to 6 around the 4 chars a short key packs into; NUL and U+FFFF (all-zero and all-one
        // 16-bit fields), lone and paired surrogates
        return Arbitraries.strings().withChars("a\u0000\uffff\ud83d\ude00<").ofMinLength(0).ofMaxLength(6).list().ofMaxSize(120);
    }

    @Provide
    Arbitrary<String> oddTexts() {
        return Arbitraries.strings().withChars("a\u0000\uffff\ud83d\ude00<b").ofMaxLength(10);
    }

    @Property(tries = 300)
    void spans_of_nul_high_and_surrogate_chars_give_what_a_hash_map_gives(@ForAll("oddKeys") List<String> keys,
            @ForAll("oddTexts") String text) {
        every_span_of_a_text_gives_what_a_hash_map_gives_for_its_string(keys, text);
    }

    @Property(tries = 60)
    void tables_of_every_size_near_a_capacity_step_find_each_key_and_no_other(
            @ForAll @IntRange(min = 0, max = 11) int power, @ForAll @IntRange(min = -2, max = 2) int offset,
            @ForAll long seed) {
        int size = Math.max(0, (1 << power) + offset);
        SplittableRandom random = new SplittableRandom(seed);
        Map<String, Integer> entries = new HashMap<>();
        while (entries.size() < size) {
            entries.putIfAbsent(randomKey(random), random.nextInt(Integer.MAX_VALUE));
        }
        SpanIndex index = new SpanIndex(entries);
        for (Map.Entry<String, Integer> entry : entries.entrySet()) {
            String padded = "\u0000" + entry.getKey() + "z";
            assertThat(index.get(padded, 1, padded.length() - 1)).as("key \"%s\"", entry.getKey()).isEqualTo(entry.getValue());
        }
        for (int i = 0; i < 200; i++) {
            String probe = randomKey(random);
            assertThat(index.get(probe, 0, probe.length())).isEqualTo(entries.getOrDefault(probe, SpanIndex.MISSING));
        }
    }

    private static String randomKey(SplittableRandom random) {
        char[] chars = new char[random.nextInt(9)];
        for (int i = 0; i < chars.length; i++) {
            chars[i] = random.nextInt(4) == 0 ? (char) random.nextInt(Character.MAX_VALUE + 1) : (char) ('a' + random.nextInt(3));
        }
        return new String(chars);
    }

    @Test
    void keys_that_differ_only_by_nul_chars_are_told_apart() {
        // packed as they are (16 bits a char, zero-filled), these would share their bits: only the length tells them apart
        Map<String, Integer> entries = Map.of("a", 0, "\u0000a", 1, "a\u0000", 2, "\u0000\u0000a", 3, "", 4,
                "\u0000", 5, "\u0000\u0000\u0000\u0000", 6, "\u0000\u0000\u0000\u0000\u0000", 7);
        SpanIndex index = new SpanIndex(entries);
        for (Map.Entry<String, Integer> entry : entries.entrySet()) {
            assertThat(index.get(entry.getKey(), 0, entry.getKey().length())).isEqualTo(entry.getValue());
        }
        assertThat(index.get("\u0000\u0000", 0, 2)).isEqualTo(SpanIndex.MISSING);
        assertThat(index.get("a\u0000\u0000", 0, 3)).isEqualTo(SpanIndex.MISSING);
        assertThat(index.get("\u0000\u0000\u0000", 0, 3)).isEqualTo(SpanIndex.MISSING);
    }

    @Property(tries = 40)
    void short_keys_over_an_alphabet_too_large_for_four_codes_in_an_int_are_still_found(
            @ForAll @IntRange(min = 200, max = 70_000) int alphabet, @ForAll long seed) {
        // more than 255 distinct chars in the short keys make 9 or more bits a char, so 3- and 4-char keys
        // (and at 65,536 chars, 2-char ones) move to the table of long keys
        SplittableRandom random = new SplittableRandom(seed);
        Map<String, Integer> entries = new HashMap<>();
        for (int c = 0; c < Math.min(alphabet, Character.MAX_VALUE + 1); c++) {
            entries.put(String.valueOf((char) c), entries.size());
        }
        for (int i = 0; i < 300; i++) {
            char[] key = new char[1 + random.nextInt(6)];
            for (int k = 0; k < key.length; k++) {
                key[k] = (char) random.nextInt(Math.min(alphabet, Character.MAX_VALUE + 1));
            }
            entries.putIfAbsent(new String(key), entries.size());
        }
        SpanIndex index = new SpanIndex(entries);
        for (Map.Entry<String, Integer> entry : entries.entrySet()) {
            assertThat(index.get(entry.getKey(), 0, entry.getKey().length())).isEqualTo(entry.getValue());
        }
        for (int i = 0; i < 300; i++) {
            String probe = randomKey(random);
            assertThat(index.get(probe, 0, probe.length())).isEqualTo(entries.getOrDefault(probe, SpanIndex.MISSING));
        }
    }

    @Test
    void the_largest_value_and_zero_come_back_whole() {
        SpanIndex index = new SpanIndex(Map.of("ab", Integer.MAX_VALUE, "abcdefg", Integer.MAX_VALUE - 1, "b", 0));
        assertThat(index.get("ab", 0, 2)).isEqualTo(Integer.MAX_VALUE);
        assertThat(index.get("abcdefg", 0, 7)).isEqualTo(Integer.MAX_VALUE - 1);
        assertThat(index.get("b", 0, 1)).isZero();
    }

    @Test
    void a_string_builder_span_is_looked_up_like_a_string() {
        SpanIndex index = new SpanIndex(Map.of("<ab", 3, "<abcde>", 9));
        StringBuilder marked = new StringBuilder("<abcde>");
        assertThat(index.get(marked, 0, 3)).isEqualTo(3);
        assertThat(index.get(marked, 0, 7)).isEqualTo(9);
        assertThat(index.get(marked, 1, 3)).isEqualTo(SpanIndex.MISSING);
    }

    @Test
    void keys_with_the_same_hash_are_told_apart_by_their_characters() {
        // "Aa" and "BB" share String.hashCode() 2112 (31 * 'A' + 'a' == 31 * 'B' + 'B')
        SpanIndex index = new SpanIndex(Map.of("Aa", 0, "BB", 1));
        assertThat(index.get("xAa", 1, 3)).isEqualTo(0);
        assertThat(index.get("BBx", 0, 2)).isEqualTo(1);
        assertThat(index.get("AaBB", 1, 3)).isEqualTo(SpanIndex.MISSING);
    }

    @Test
    void an_empty_index_finds_nothing() {
        SpanIndex index = new SpanIndex(Map.of());
        assertThat(index.get("abc", 0, 3)).isEqualTo(SpanIndex.MISSING);
        assertThat(index.get("abc", 1, 1)).isEqualTo(SpanIndex.MISSING);
        assertThat(index.get("abcdefgh", 0, 8)).isEqualTo(SpanIndex.MISSING);
    }

    @Test
    void rejects_a_negative_value() {
        assertThatThrownBy(() -> new SpanIndex(Map.of("a", -1))).isInstanceOf(IllegalArgumentException.class)
                .hasMessageContaining("values must be >= 0, was -1");
    }
}
