package dev.pressmark.core.drift;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import java.util.ArrayList;
import java.util.List;
import java.util.OptionalLong;
import java.util.concurrent.atomic.AtomicReference;
import org.junit.jupiter.api.Test;

/** Window statistics on small cases worked by hand. */
class DriftWindowTest {

    /** The hand-worked values are rounded to seven places. */
    private static final double HAND_WORKED = 1e-7;

    /** Four training rows: "a" in two, "b" in one, six distinct (row, token) pairs in all. */
    private static DriftProfile profile(boolean withTotal) {
        return new DriftProfile(4, 8, 0.125, new LengthSummary(2.0, 1, 2, 4),
                List.of(new DriftProfile.TopFeature("title:a", 2), new DriftProfile.TopFeature("title:b", 1)),
                withTotal ? OptionalLong.of(6) : OptionalLong.empty());
    }

    private static List<List<String>> item(String... tokens) {
        return List.of(List.of(tokens));
    }

    @Test
    void an_empty_window_reports_the_training_rate_and_no_live_statistics() {
        DriftReport report = new DriftWindow(profile(true), List.of("title"), 10).report();
        assertThat(report).isEqualTo(new DriftReport(0, 0.125, null, null, null, null));
    }

    @Test
    void computes_the_rates_the_index_and_the_length_shift_of_two_items() {
        DriftWindow window = new DriftWindow(profile(true), List.of("title"), 10);
        window.add(item("a", "a", "c"), 1);
        window.add(item("b"), 0);
        DriftReport report = window.report();
        assertThat(report.windowItems()).isEqualTo(2);
        // One unknown token of four.
        assertThat(report.liveUnknownRate()).isEqualTo(0.25);
        // Bins a, b, other: training 2/6, 1/6, 3/6; live {a, c} and {b} give 1/3, 1/3, 1/3.
        // (1/3 - 1/3) ln 1 + (1/3 - 1/6) ln 2 + (1/3 - 1/2) ln(2/3) = 0 + 0.1155245 + 0.0675775.
        assertThat(report.psi()).isCloseTo(0.1831020, within(HAND_WORKED));
        assertThat(report.status()).isEqualTo(DriftStatus.WATCH);
        // Lengths 1 and 3: mean 2, nearest-rank p10 = 1st, p50 = 1st, p90 = 2nd of two.
        assertThat(report.length().live()).isEqualTo(new LengthSummary(2.0, 1, 1, 3));
        // Against training mean 2, p50 2, p90 4: 0, (1 - 2) / 2, (3 - 4) / 4.
        assertThat(report.length().mean()).isEqualTo(0.0);
        assertThat(report.length().p50()).isEqualTo(-0.5);
        assertThat(report.length().p90()).isEqualTo(-0.25);
    }

    @Test
    void without_the_recorded_total_the_top_features_share_among_themselves() {
        DriftWindow window = new DriftWindow(profile(false), List.of("title"), 10);
        window.add(item("a", "a", "c"), 1);
        window.add(item("b"), 0);
        // Bins a, b: training 2/3, 1/3; live 1/2, 1/2.
        // (1/2 - 2/3) ln(3/4) + (1/2 - 1/3) ln(3/2) = 0.0479467 + 0.0675775.
        assertThat(window.report().psi()).isCloseTo(0.1155245, within(HAND_WORKED));
    }

    @Test
    void the_same_shares_as_training_give_an_index_of_zero() {
        DriftWindow window = new DriftWindow(profile(true), List.of("title"), 10);
        // As the profile: a in two items, b in one, six distinct pairs, eight tokens of which one unknown.
        window.add(item("a", "x", "x"), 1);
        window.add(item("a", "b", "y"), 0);
        window.add(item("w", "w"), 0);
        DriftReport report = window.report();
        assertThat(report.psi()).isEqualTo(0.0);
        assertThat(report.liveUnknownRate()).isEqualTo(0.125);
        assertThat(report.status()).isEqualTo(DriftStatus.OK);
    }

    @Test
    void a_full_window_forgets_its_oldest_items() {
        DriftWindow window = new DriftWindow(profile(true), List.of("title"), 2);
        window.add(item("q", "q", "q", "q", "q", "q", "q", "q"), 8);
        window.add(item("a", "a", "c"), 1);
        window.add(item("b"), 0);
        DriftReport report = window.report();
        assertThat(report.windowItems()).isEqualTo(2);
        assertThat(report.liveUnknownRate()).isEqualTo(0.25);
        assertThat(report.psi()).isCloseTo(0.1831020, within(HAND_WORKED));
        assertThat(report.length().live()).isEqualTo(new LengthSummary(2.0, 1, 1, 3));
    }

    @Test
    void a_token_of_another_field_is_another_feature() {
        DriftProfile profile = new DriftProfile(2, 2, 0.0, new LengthSummary(1.0, 1, 1, 1),
                List.of(new DriftProfile.TopFeature("title:a", 1), new DriftProfile.TopFeature("brand:a", 1)), OptionalLong.of(2));
        DriftWindow window = new DriftWindow(profile, List.of("title", "brand"), 4);
        window.add(List.of(List.of("a"), List.of()), 0);
        window.add(List.of(List.of(), List.of("a")), 0);
        assertThat(window.report().psi()).isEqualTo(0.0);
        window.add(List.of(List.of(), List.of("a")), 0);
        assertThat(window.report().psi()).isGreaterThan(0.0);
    }

    @Test
    void refuses_items_that_do_not_fit_the_window() {
        DriftWindow window = new DriftWindow(profile(true), List.of("title"), 2);
        assertThatThrownBy(() -> window.add(List.of(List.of("a"), List.of("b")), 0))
                .isInstanceOf(IllegalArgumentException.class).hasMessageContaining("the item has 2 fields, the window reads 1");
        assertThatThrownBy(() -> window.add(item("a"), 2))
                .isInstanceOf(IllegalArgumentException.class).hasMessageContaining("unknownTokens must be in [0, 1]");
        assertThatThrownBy(() -> new DriftWindow(profile(true), List.of("title"), 0))
                .isInstanceOf(IllegalArgumentException.class).hasMessage("capacity must be >= 1 item, was 0");
    }

    @Test
    void readers_see_whole_items_while_one_thread_adds() throws InterruptedException {
        DriftWindow window = new DriftWindow(profile(true), List.of("title"), 50);
        AtomicReference<Throwable> failure = new AtomicReference<>();
        List<Thread> readers = new ArrayList<>();
        Thread writer = new Thread(() -> {
            for (int i = 0; i < 20_000; i++) {
                window.add(item("a", "b"), 1);
            }
        });
        for (int r = 0; r < 2; r++) {
            readers.add(new Thread(() -> {
                try {
                    while (writer.isAlive()) {
                        DriftReport report = window.report();
                        // Every item has two tokens, one unknown: any torn read shows as another rate.
                        if (report.windowItems() > 0) {
                            assertThat(report.liveUnknownRate()).isEqualTo(0.5);
                            assertThat(report.length().live().mean()).isEqualTo(2.0);
                        }
                    }
                } catch (Throwable t) {
                    failure.set(t);
                }
            }));
        }
        writer.start();
        readers.forEach(Thread::start);
        writer.join();
        for (Thread reader : readers) {
            reader.join();
        }
        assertThat(failure.get()).isNull();
        assertThat(window.size()).isEqualTo(50);
    }
}
