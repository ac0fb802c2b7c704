package dev.pressmark.core.search;

import static org.assertj.core.api.Assertions.assertThat;

import java.util.List;
import org.junit.jupiter.api.Test;

/**
 * Hand-worked cases of the one-standard-error rule as Hastie, Tibshirani and Friedman state it
 * ("The Elements of Statistical Learning", 2nd ed., 2009, section 7.10): the simplest model whose
 * error is no more than one standard error above the best model's; here, for a score, no more than
 * one standard error below the best score.
 */
class PickTest {

    private static Pick.Scored scored(double mean, double se, double c, double features) {
        return new Pick.Scored(mean, se, c, features);
    }

    @Test
    void best_takes_the_highest_mean() {
        List<Pick.Scored> candidates = List.of(scored(0.80, 0.01, 0.1, 100), scored(0.85, 0.02, 1, 100), scored(0.84, 0.01, 10, 100));
        assertThat(Pick.BEST.choose(candidates)).isEqualTo(1);
    }

    @Test
    void best_breaks_a_tie_towards_the_simpler_candidate() {
        List<Pick.Scored> candidates = List.of(scored(0.85, 0.01, 10, 100), scored(0.85, 0.01, 1, 100), scored(0.85, 0.01, 1, 50));
        assertThat(Pick.BEST.choose(candidates)).isEqualTo(2);
    }

    @Test
    void one_se_takes_the_smallest_c_within_one_standard_error_of_the_best() {
        // best 0.85 ± 0.02: the floor is 0.83; c = 0.1 scores 0.82 (out), c = 0.3 scores 0.83 (in, on the floor)
        List<Pick.Scored> candidates = List.of(scored(0.82, 0.01, 0.1, 100), scored(0.83, 0.01, 0.3, 100),
                scored(0.85, 0.02, 3, 100), scored(0.84, 0.01, 1, 100));
        assertThat(Pick.ONE_SE.choose(candidates)).isEqualTo(1);
    }

    @Test
    void one_se_then_takes_the_fewest_features() {
        List<Pick.Scored> candidates = List.of(scored(0.85, 0.02, 1, 800), scored(0.84, 0.01, 1, 200), scored(0.80, 0.01, 1, 50));
        assertThat(Pick.ONE_SE.choose(candidates)).isEqualTo(1);
    }

    @Test
    void one_se_with_no_spread_is_best() {
        List<Pick.Scored> candidates = List.of(scored(0.84, 0.0, 0.1, 100), scored(0.85, 0.0, 1, 100));
        assertThat(Pick.ONE_SE.choose(candidates)).isEqualTo(1);
    }
}
