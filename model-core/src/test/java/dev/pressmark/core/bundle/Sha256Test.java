package dev.pressmark.core.bundle;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.ByteArrayInputStream;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import org.junit.jupiter.api.Test;

/**
 * The expected digests are NIST's published examples for SHA-256 (FIPS 180-4; "Cryptographic
 * Standards and Guidelines: Examples with Intermediate Values", SHA256.pdf and SHA256 two-block
 * message), and the well-known digest of the empty message.
 */
class Sha256Test {

    private static final String ONE_BLOCK = "abc";
    private static final String TWO_BLOCK = "abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq";

    @Test
    void the_one_block_message_abc_gives_nists_digest() {
        assertThat(Sha256.hex(ONE_BLOCK.getBytes(StandardCharsets.US_ASCII)))
                .isEqualTo("ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad");
    }

    @Test
    void the_two_block_message_gives_nists_digest() {
        assertThat(Sha256.hex(TWO_BLOCK.getBytes(StandardCharsets.US_ASCII)))
                .isEqualTo("248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1");
    }

    @Test
    void the_empty_message_gives_the_published_digest() {
        assertThat(Sha256.hex(new byte[0])).isEqualTo("e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855");
    }

    @Test
    void a_stream_gives_the_same_digest_as_its_bytes_across_buffer_boundaries() throws IOException {
        // One million 'a's: FIPS 180-2 appendix B.3 (from memory), longer than the read buffer.
        byte[] million = "a".repeat(1_000_000).getBytes(StandardCharsets.US_ASCII);
        assertThat(Sha256.hex(new ByteArrayInputStream(million)))
                .isEqualTo("cdc76e5c9914fb9281a1c7e284d73e67f1809a48a497200e046d39ccc7112cd0");
    }

    @Test
    void only_lower_case_64_digit_hex_counts_as_a_digest() {
        assertThat(Sha256.isHex("e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855")).isTrue();
        assertThat(Sha256.isHex("E3B0C44298FC1C149AFBF4C8996FB92427AE41E4649B934CA495991B7852B855")).isFalse();
        assertThat(Sha256.isHex("e3b0")).isFalse();
        assertThat(Sha256.isHex(null)).isFalse();
    }
}
