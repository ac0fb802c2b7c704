package dev.pressmark.core.tokenize;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.util.HashMap;
import java.util.List;
import java.util.Map;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.constraints.LongRange;
import net.jqwik.api.constraints.Size;
import org.junit.jupiter.api.Test;

class LongIntMapTest {

    @Property(tries = 200)
    void maps_keys_as_java_util_hash_map_does(
            @ForAll @Size(max = 3000) List<@LongRange(min = 0, max = 5000) Long> keys) {
        // Reference: java.util.HashMap with putIfAbsent, from the JDK.
        Map<Long, Integer> expected = new HashMap<>();
        LongIntMap actual = new LongIntMap(4);
        for (int i = 0; i < keys.size(); i++) {
            Integer previous = expected.putIfAbsent(keys.get(i), i);
            assertThat(actual.putIfAbsent(keys.get(i), i)).isEqualTo(previous == null ? i : previous);
        }

        assertThat(actual.size()).isEqualTo(expected.size());
        for (long key = 0; key <= 5000; key++) {
            assertThat(actual.get(key)).isEqualTo(expected.getOrDefault(key, LongIntMap.MISSING));
        }
        assertThat(actual.keys()).containsExactlyInAnyOrder(
                expected.keySet().stream().mapToLong(Long::longValue).toArray());
    }

    @Test
    void refuses_a_negative_key() {
        assertThatThrownBy(() -> new LongIntMap(4).putIfAbsent(-1, 0))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessage("key must be >= 0, was -1");
    }
}
