package dev.pressmark.server;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import org.junit.jupiter.api.Test;

class BearerTokenTest {

    @Test
    void matches_only_the_same_token_whatever_its_length() {
        BearerToken token = BearerToken.of("s3cret-token");
        assertThat(token.matches("s3cret-token")).isTrue();
        assertThat(token.matches("s3cret-toke")).isFalse();
        assertThat(token.matches("s3cret-token!")).isFalse();
        assertThat(token.matches("S3cret-token")).isFalse();
        assertThat(token.matches("")).isFalse();
    }

    @Test
    void surrounding_white_space_of_a_token_file_is_not_part_of_the_token() {
        assertThat(BearerToken.of("  abc\n").matches("abc")).isTrue();
    }

    @Test
    void never_shows_the_token_in_its_string_form() {
        assertThat(BearerToken.of("s3cret-token").toString()).doesNotContain("s3cret");
    }

    @Test
    void refuses_an_empty_token_or_one_with_inner_white_space() {
        assertThatThrownBy(() -> BearerToken.of(" \n")).isInstanceOf(IllegalArgumentException.class).hasMessageContaining("empty");
        assertThatThrownBy(() -> BearerToken.of("a b")).isInstanceOf(IllegalArgumentException.class).hasMessageContaining("white space");
    }
}
