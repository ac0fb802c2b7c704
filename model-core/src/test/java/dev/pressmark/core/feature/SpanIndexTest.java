package dev.pressmark.core.feature;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.util.HashMap;
import java.util.List;
import java.util.Map;
import net.jqwik.api.Arbitraries;
import net.jqwik.api.Arbitrary;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.Provide;
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
        assertThat(new SpanIndex(Map.of()).get("abc", 0, 3)).isEqualTo(SpanIndex.MISSING);
    }

    @Test
    void rejects_a_negative_value() {
        assertThatThrownBy(() -> new SpanIndex(Map.of("a", -1))).isInstanceOf(IllegalArgumentException.class)
                .hasMessageContaining("values must be >= 0, was -1");
    }
}
