package dev.pressmark.core.bundle;

import dev.pressmark.core.classify.LinearWeights;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;

/**
 * The bundle's {@code weights.bin}: a linear model's weights as little-endian IEEE 754 float64
 * values after a small header.
 *
 * <pre>
 * offset  size  field
 *      0     4  magic "PMWB"
 *      4     4  int32 format version (1)
 *      8     4  int32 classes
 *     12     4  int32 scores (1 for two classes, else the class count)
 *     16     4  int32 features
 *     20     8  float64 bias feature value
 *     28     …  scores × (features + 1) float64: per score its feature weights, then its bias weight
 * </pre>
 */
final class WeightsCodec {

    static final int VERSION = 1;
    private static final byte[] MAGIC = {'P', 'M', 'W', 'B'};
    private static final int HEADER_BYTES = 28;

    private WeightsCodec() {
    }

    static byte[] write(LinearWeights weights) {
        int scores = weights.numScores();
        int features = weights.numFeatures();
        ByteBuffer out = ByteBuffer.allocate(HEADER_BYTES + 8 * scores * (features + 1)).order(ByteOrder.LITTLE_ENDIAN);
        out.put(MAGIC).putInt(VERSION).putInt(weights.numClasses()).putInt(scores).putInt(features).putDouble(weights.bias());
        for (int k = 0; k < scores; k++) {
            for (int j = 0; j < features; j++) {
                out.putDouble(weights.weight(k, j));
            }
            out.putDouble(weights.biasWeight(k));
        }
        return out.array();
    }

    static LinearWeights read(byte[] bytes) {
        return read(bytes, BundleLimits.DEFAULT.maxFeatures());
    }

    /** Reads the weights, refusing a header that declares more than {@code maxFeatures} features before anything is sized from it. */
    static LinearWeights read(byte[] bytes, int maxFeatures) {
        ByteBuffer in = ByteBuffer.wrap(bytes).order(ByteOrder.LITTLE_ENDIAN);
        if (bytes.length < HEADER_BYTES || in.get(0) != MAGIC[0] || in.get(1) != MAGIC[1] || in.get(2) != MAGIC[2] || in.get(3) != MAGIC[3]) {
            throw corrupt("does not start with the weights header");
        }
        in.position(4);
        int version = in.getInt();
        if (version != VERSION) {
            throw new BundleException(BundleException.FORMAT_VERSION, "weights.bin: unsupported format version " + version
                    + "; this program reads " + VERSION);
        }
        int classes = in.getInt();
        int scores = in.getInt();
        int features = in.getInt();
        double bias = in.getDouble();
        if (classes < 2 || scores != (classes == 2 ? 1 : classes) || features < 0) {
            throw corrupt("inconsistent header: " + classes + " classes, " + scores + " scores, " + features + " features");
        }
        if (features > maxFeatures) {
            throw BundleLimits.exceeded(String.format("weights.bin: the header declares %,d features, more than %,d, the limit on a model's"
                    + " features", features, maxFeatures));
        }
        // below 2^62, so this product cannot overflow; the same count in bytes could, and did let a
        // 28-byte file with 2^30 scores and 2^31 - 1 features past the size check
        long values = (long) scores * (features + 1L);
        if (values != (bytes.length - HEADER_BYTES) / 8 || (bytes.length - HEADER_BYTES) % 8 != 0) {
            throw corrupt("holds " + bytes.length + " bytes, its header calls for " + HEADER_BYTES + " + 8 × " + values);
        }
        double[][] w = new double[scores][features + 1];
        for (int k = 0; k < scores; k++) {
            for (int j = 0; j <= features; j++) {
                w[k][j] = in.getDouble();
            }
        }
        try {
            return LinearWeights.of(classes, bias, w);
        } catch (IllegalArgumentException e) {
            throw corrupt(e.getMessage());
        }
    }

    private static BundleException corrupt(String what) {
        return new BundleException(BundleException.CORRUPT, "weights.bin " + what);
    }
}
