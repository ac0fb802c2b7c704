package dev.pressmark.server;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.util.ArrayList;
import java.util.HexFormat;
import java.util.List;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.constraints.AlphaChars;
import net.jqwik.api.constraints.NumericChars;
import net.jqwik.api.constraints.StringLength;
import org.junit.jupiter.api.Test;

class BearerTokenTest {

    /**
     * The comparison does not short-circuit on where a wrong token differs or how long it is: every
     * presented token, a prefix, an extension, a different first or last character, empty or huge,
     * is compared as a 32-byte SHA-256 against the stored 32-byte digest by MessageDigest.isEqual,
     * whose time for equal-length arrays "depends only on the length of digesta" (JDK 17 API,
     * java.security.MessageDigest#isEqual). A timing measurement would be flaky on a shared machine;
     * this checks the structure that makes the time independent instead.
     */
    @Test
    void every_wrong_token_is_compared_as_a_digest_of_one_fixed_length() {
        String secret = "s3cret-token-0123456789";
        BearerToken token = BearerToken.of(secret);
        List<String> wrong = new ArrayList<>(List.of("", "x", "S3cret-token-0123456789", "s3cret-token-012345678X", secret + "0",
                secret.repeat(1_000), "\u0000" + secret));
        for (int n = 0; n < secret.length(); n++) {
            wrong.add(secret.substring(0, n));
        }
        for (String presented : wrong) {
            assertThat(BearerToken.comparedDigest(presented)).as(presented.length() + " chars").hasSize(32);
            assertThat(token.matches(presented)).as(presented).isFalse();
        }
        assertThat(BearerToken.comparedDigest(secret)).hasSize(32);
        assertThat(token.matches(secret)).isTrue();
        // FIPS 180-2, Appendix B.1: SHA-256("abc")
        assertThat(HexFormat.of().formatHex(BearerToken.comparedDigest("abc")))
                .isEqualTo("ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad");
    }

    @Property(tries = 300)
    void a_token_matches_exactly_itself(@ForAll @AlphaChars @NumericChars @StringLength(min = 1, max = 40) String stored,
            @ForAll @AlphaChars @NumericChars @StringLength(max = 40) String presented) {
        assertThat(BearerToken.of(stored).matches(presented)).isEqualTo(stored.equals(presented));
        assertThat(BearerToken.of(stored).matches(stored)).isTrue();
    }

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
