package dev.pressmark.cli;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;
import org.junit.jupiter.api.Test;

class ConsoleProgressTest {

    @Test
    void the_time_left_is_the_time_per_step_so_far_times_the_steps_to_go() {
        // 10 of 50 steps in 4 s: 0.4 s a step, 40 steps to go
        assertThat(ConsoleProgress.secondsLeft(10, 50, 4_000_000_000L)).isCloseTo(16.0, within(1e-9));
        assertThat(ConsoleProgress.secondsLeft(0, 50, 4_000_000_000L)).isNegative();
        assertThat(ConsoleProgress.secondsLeft(50, 50, 4_000_000_000L)).isZero();
    }

    @Test
    void durations_read_as_seconds_minutes_or_hours() {
        assertThat(ConsoleProgress.duration(41.6)).isEqualTo("42 s");
        assertThat(ConsoleProgress.duration(185)).isEqualTo("3 min 5 s");
        assertThat(ConsoleProgress.duration(3720)).isEqualTo("1 h 2 min");
        assertThat(ConsoleProgress.duration(-1)).isEqualTo("an unknown time");
    }

    @Test
    void a_log_gets_one_line_per_finished_task() {
        ByteArrayOutputStream bytes = new ByteArrayOutputStream();
        ConsoleProgress progress = new ConsoleProgress(new PrintStream(bytes, true, StandardCharsets.UTF_8), false);
        progress.start("search: 2 candidates x 2 folds", 4);
        for (int i = 1; i <= 4; i++) {
            progress.advance(i);
        }
        progress.finish();
        assertThat(bytes.toString(StandardCharsets.UTF_8)).matches("pressmark: search: 2 candidates x 2 folds: 4 of 4 done in \\d+\\.\\d s\\R");
    }
}
