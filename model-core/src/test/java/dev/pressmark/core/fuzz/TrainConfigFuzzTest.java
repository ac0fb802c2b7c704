package dev.pressmark.core.fuzz;

import static org.assertj.core.api.Assertions.assertThat;

import com.code_intelligence.jazzer.api.FuzzedDataProvider;
import com.code_intelligence.jazzer.junit.FuzzTest;
import dev.pressmark.core.PressmarkException;
import dev.pressmark.core.train.TrainConfig;
import org.junit.jupiter.api.Tag;

/**
 * Arbitrary text as {@code train.yaml}. The parser either returns a config whose values passed
 * their checks or throws a {@link PressmarkException} whose message names the file; any other
 * exception (a null message, a parser error that escaped unwrapped, a stack overflow) is a bug.
 *
 * <p>Seeds: the example config of the design note, and configs with an unknown key, wrong types,
 * nulls in a list, anchors and aliases, flow and block styles mixed, and deep nesting.
 */
@Tag("slow") // Jazzer's agent instruments every class loaded after it (over 10 s); scripts/fuzz.sh fuzzes these
final class TrainConfigFuzzTest {

    private static final String SOURCE = "train.yaml";

    @FuzzTest
    void any_text_parses_to_a_valid_config_or_fails_with_a_message_naming_the_file(FuzzedDataProvider data) {
        String yaml = data.consumeRemainingAsString();
        TrainConfig config;
        try {
            config = TrainConfig.parse(yaml, SOURCE);
        } catch (PressmarkException e) {
            assertThat(e.getMessage()).startsWith(SOURCE);
            assertThat(e.code()).isEqualTo("invalid-config");
            return;
        }
        assertThat(TrainConfig.NAME.matcher(config.name()).matches()).isTrue();
        assertThat(config.data().text()).isNotEmpty().doesNotContainNull().doesNotHaveDuplicates();
        assertThat(config.data().text()).doesNotContain(config.data().label());
    }
}
