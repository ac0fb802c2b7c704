package dev.pressmark.core.bundle;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import dev.pressmark.core.classify.LinearWeights;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.util.Arrays;
import org.junit.jupiter.api.Test;

class WeightsCodecTest {

    /** The header of the layout in {@link WeightsCodec}'s Javadoc, followed by {@code values}. */
    private static byte[] file(int classes, int scores, int features, double... values) {
        ByteBuffer out = ByteBuffer.allocate(28 + 8 * values.length).order(ByteOrder.LITTLE_ENDIAN);
        out.put(new byte[] {'P', 'M', 'W', 'B'}).putInt(1).putInt(classes).putInt(scores).putInt(features).putDouble(1.0);
        for (double v : values) {
            out.putDouble(v);
        }
        return out.array();
    }

    @Test
    void reads_a_file_written_by_hand_after_the_documented_layout() {
        LinearWeights weights = WeightsCodec.read(file(2, 1, 2, 0.5, -1.5, 0.25));
        assertThat(weights.numClasses()).isEqualTo(2);
        assertThat(weights.numFeatures()).isEqualTo(2);
        assertThat(weights.weight(0, 0)).isEqualTo(0.5);
        assertThat(weights.weight(0, 1)).isEqualTo(-1.5);
        assertThat(weights.biasWeight(0)).isEqualTo(0.25);
        assertThat(WeightsCodec.write(weights)).isEqualTo(file(2, 1, 2, 0.5, -1.5, 0.25));
    }

    @Test
    void a_header_whose_byte_count_overflows_is_corrupt_not_a_huge_allocation() {
        // found by the bundle fuzz test's seed weights-size-overflow.pmb: 8 * 2^30 * 2^31 wraps to 0
        // in 64 bits, so the 28-byte header alone passed the size check and the reader then asked for
        // a double[2^30][-2^31]
        assertThatThrownBy(() -> WeightsCodec.read(file(1 << 30, 1 << 30, Integer.MAX_VALUE), Integer.MAX_VALUE))
                .isInstanceOf(BundleException.class)
                .hasMessageContaining("its header calls for 28 + 8 × 2305843009213693952");
    }

    @Test
    void a_header_declaring_more_features_than_the_limit_is_refused_naming_the_limit_before_the_size_check() {
        assertThatThrownBy(() -> WeightsCodec.read(file(2, 1, Integer.MAX_VALUE)))
                .isInstanceOf(BundleException.class)
                .hasMessage("weights.bin: the header declares 2,147,483,647 features, more than 1,048,576, the limit on a model's features")
                .extracting(e -> ((BundleException) e).code()).isEqualTo(BundleException.LIMIT);
        assertThat(WeightsCodec.read(file(2, 1, 2, 0.5, -1.5, 0.25), 2).numFeatures()).isEqualTo(2);
        assertThatThrownBy(() -> WeightsCodec.read(file(2, 1, 2, 0.5, -1.5, 0.25), 1)).hasMessageContaining("more than 1, the limit");
    }

    @Test
    void a_file_that_ends_inside_a_value_is_corrupt() {
        byte[] whole = file(2, 1, 2, 0.5, -1.5, 0.25);
        byte[] cut = Arrays.copyOf(whole, whole.length - 3);
        assertThatThrownBy(() -> WeightsCodec.read(cut)).isInstanceOf(BundleException.class).hasMessageContaining("holds 49 bytes");
    }
}
