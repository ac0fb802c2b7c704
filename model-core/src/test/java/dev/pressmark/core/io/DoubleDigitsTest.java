package dev.pressmark.core.io;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.core.io.NumberOutput;
import java.math.BigInteger;
import java.util.SplittableRandom;
import net.jqwik.api.Arbitraries;
import net.jqwik.api.Arbitrary;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.Provide;
import org.junit.jupiter.api.Test;

/**
 * {@link DoubleDigits} against its reference, Jackson's shortest-digits writer
 * ({@code NumberOutput.toString(v, true)}, jackson-core 2.x, R. Giulietti's Schubfach), which the
 * HTTP answers use: the same text for every double, and text that parses back to the same bits.
 * The logarithm approximations are checked against exact {@link BigInteger} arithmetic over the
 * whole range the algorithm uses them in.
 */
class DoubleDigitsTest {

    @Property(tries = 20_000)
    void writes_what_jacksons_shortest_digit_writer_writes(@ForAll("doubles") double v) {
        assertSame(v);
    }

    @Test
    void writes_what_jackson_writes_for_two_million_doubles_of_every_kind() {
        SplittableRandom random = new SplittableRandom(20261205);
        for (int i = 0; i < 500_000; i++) {
            assertSame(Double.longBitsToDouble(random.nextLong()));
            assertSame(random.nextDouble());
            assertSame(Math.scalb(random.nextDouble(), random.nextInt(-1100, 1030)));
            assertSame((double) random.nextLong(-(1L << 54), 1L << 54));
        }
    }

    @Test
    void writes_the_edges_of_the_layout_and_of_the_range_as_jackson_does() {
        double[] edges = {0.0, -0.0, Double.NaN, Double.POSITIVE_INFINITY, Double.NEGATIVE_INFINITY, Double.MIN_VALUE,
            -Double.MIN_VALUE, 2 * Double.MIN_VALUE, 3 * Double.MIN_VALUE, Double.MIN_NORMAL, Double.MAX_VALUE,
            Math.nextDown(Double.MIN_NORMAL), 1.0, 0.1, 0.3, 2e23, 9007199254740992.0, 9007199254740993.0};
        for (double v : edges) {
            assertSame(v);
        }
        for (int p = -325; p <= 309; p++) {
            double power = Double.parseDouble("1e" + p);
            assertSame(power);
            assertSame(Math.nextUp(power));
            assertSame(Math.nextDown(power));
            assertSame(5 * power);
        }
        for (int e = -1074; e <= 1023; e++) {
            double power = Math.scalb(1.0, e);
            assertSame(power);
            assertSame(Math.nextUp(power));
            assertSame(Math.nextDown(power));
        }
        assertThat(DoubleDigits.toString(0.001)).isEqualTo("0.001");
        assertThat(DoubleDigits.toString(9999999.0)).isEqualTo("9999999.0");
        assertThat(DoubleDigits.toString(1.0E7)).isEqualTo("1.0E7");
        assertThat(DoubleDigits.toString(-1.0E-4)).isEqualTo("-1.0E-4");
    }

    @Test
    void never_writes_more_than_max_bytes_and_writes_from_the_offset_given() {
        byte[] out = new byte[3 + DoubleDigits.MAX_BYTES];
        out[2] = 'x';
        int end = DoubleDigits.write(-2.2250738585072014E-308, out, 3);
        assertThat(end - 3).isEqualTo(DoubleDigits.MAX_BYTES);
        assertThat(out[2]).isEqualTo((byte) 'x');
        assertThat(new String(out, 3, end - 3, java.nio.charset.StandardCharsets.US_ASCII)).isEqualTo("-2.2250738585072014E-308");
    }

    @Test
    void the_logarithm_approximations_are_exact_floors_over_the_range_used() {
        for (int e = -1100; e <= 1100; e++) {
            assertThat(DoubleDigits.floorLog10Pow2(e)).as("floor(%d log10 2)", e).isEqualTo(floorLog10OfPow2(e));
            assertThat(DoubleDigits.floorLog10ThreeQuartersPow2(e)).as("floor(log10(3/4 2^%d))", e)
                    .isEqualTo(floorLog10OfThreeQuartersPow2(e));
        }
        for (int e = -340; e <= 340; e++) {
            assertThat(DoubleDigits.floorLog2Pow10(e)).as("floor(%d log2 10)", e).isEqualTo(floorLog2OfPow10(e));
        }
    }

    @Provide
    Arbitrary<Double> doubles() {
        return Arbitraries.oneOf(
                Arbitraries.longs().map(Double::longBitsToDouble),
                Arbitraries.doubles().between(0, 1).ofScale(17),
                Arbitraries.doubles().between(-1e9, 1e9).ofScale(8),
                Arbitraries.longs().between(-(1L << 53), 1L << 53).map(Long::doubleValue));
    }

    private static void assertSame(double v) {
        String expected = NumberOutput.toString(v, true);
        assertThat(DoubleDigits.toString(v)).as("bits %016x", Double.doubleToRawLongBits(v)).isEqualTo(expected);
        if (!Double.isNaN(v)) {
            assertThat(Double.doubleToRawLongBits(Double.parseDouble(expected))).isEqualTo(Double.doubleToRawLongBits(v));
        }
    }

    /** The largest n with 10^n <= 2^e. */
    private static int floorLog10OfPow2(int e) {
        if (e >= 0) {
            return BigInteger.ONE.shiftLeft(e).toString().length() - 1;
        }
        return -BigInteger.ONE.shiftLeft(-e).toString().length();
    }

    /** The largest n with 10^n <= 3 2^(e - 2). */
    private static int floorLog10OfThreeQuartersPow2(int e) {
        if (e >= 2) {
            return BigInteger.valueOf(3).shiftLeft(e - 2).toString().length() - 1;
        }
        int m = 2 - e;
        if (m <= 1) {
            return 0;
        }
        // 3 / 2^m < 1, not a power of ten: floor(log10) = -ceil(log10(2^m / 3)) = -(digits of floor(2^m / 3)).
        return -BigInteger.ONE.shiftLeft(m).divide(BigInteger.valueOf(3)).toString().length();
    }

    /** The largest n with 2^n <= 10^e. */
    private static int floorLog2OfPow10(int e) {
        if (e >= 0) {
            return BigInteger.TEN.pow(e).bitLength() - 1;
        }
        return -BigInteger.TEN.pow(-e).bitLength();
    }
}
