package dev.pressmark.core.io;

import java.math.BigInteger;

/**
 * Writes a double as the shortest decimal that reads back as exactly that double, in the layout of
 * {@link Double#toString(double)} ({@code 0.25}, {@code 1234.0}, {@code 1.0E-5}, {@code NaN}),
 * straight into a byte array: no object, string or char buffer per number.
 *
 * <p>The digits come from Schubfach (R. Giulietti, "The Schubfach way to render doubles", 2020),
 * the algorithm behind JDK 19's {@code Double.toString} and Jackson's fast double writer; the
 * decision steps and the rounding multiply ({@link #roundToOdd}) follow the paper. Where several
 * shortest decimals round to the double, the one closest to it is taken (even digit on a tie).
 * The 617 pairs of 63-bit words of 10<sup>-k</sup> scaled to 126 bits are computed exactly with
 * {@link BigInteger} when the class loads. {@code DoubleDigitsTest} checks every digit against
 * Jackson's {@code NumberOutput.toString(v, true)}, the writer the HTTP answers use.
 *
 * <p>Scoring a table writes five to a dozen numbers a row; Jackson's writer builds an object, a
 * byte array and a string for each, which was about 30 % of the CPU of {@code predict --data}.
 */
public final class DoubleDigits {

    /** The most bytes one double takes: {@code -2.2250738585072014E-308}. */
    public static final int MAX_BYTES = 24;

    /** Bits of precision of a double, the hidden one included. */
    private static final int P = 53;
    /** The exponent of the smallest subnormal: 2^-1074. */
    private static final int Q_MIN = -1074;
    /** The range of k, the power of ten the algorithm scales by. */
    private static final int K_MIN = -324;
    private static final int K_MAX = 292;
    /** Digits of the scaled decimal: enough for any double. */
    private static final int H = 17;
    private static final long C_MIN = 1L << (P - 1);
    private static final long T_MASK = C_MIN - 1;
    private static final int BQ_MASK = 0x7FF;
    /** Subnormal significands below this are scaled by ten first, to keep enough precision. */
    private static final long C_TINY = 3;
    private static final long MASK_63 = (1L << 63) - 1;
    /** ceil(2^64 / 10), as in the paper: multiplyHigh(s, this) is floor(s / 10) for every s the algorithm meets. */
    private static final long TENTH = 115_292_150_460_684_698L << 4;

    private static final long[] POW10 = powersOfTen();
    /** "00", "01", ... "99", end to end. */
    private static final byte[] DIGIT_PAIRS = digitPairs();
    /** Per k from {@link #K_MIN}: the high and low 63 bits of floor(10^-k 2^-r) + 1, with r making it 126 bits long. */
    private static final long[] G = scaledPowersOfTen();

    private DoubleDigits() {
    }

    /** {@code v} as {@link #write} writes it. */
    public static String toString(double v) {
        byte[] bytes = new byte[MAX_BYTES];
        int end = write(v, bytes, 0);
        return new String(bytes, 0, end, java.nio.charset.StandardCharsets.US_ASCII);
    }

    /**
     * Writes {@code v} into {@code out} from {@code at} and returns the index after it; {@code out}
     * must have {@link #MAX_BYTES} bytes of room from {@code at}.
     */
    public static int write(double v, byte[] out, int at) {
        long bits = Double.doubleToRawLongBits(v);
        long t = bits & T_MASK;
        int bq = (int) (bits >>> (P - 1)) & BQ_MASK;
        if (bq == BQ_MASK) {
            return ascii(t != 0 ? "NaN" : bits > 0 ? "Infinity" : "-Infinity", out, at);
        }
        int i = at;
        if (bits < 0) {
            out[i++] = '-';
        }
        if (bq != 0) {
            int mq = -Q_MIN + 1 - bq;
            long c = C_MIN | t;
            if (0 < mq && mq < P) {
                long f = c >> mq;
                if (f << mq == c) {
                    return layout(f, 0, out, i);
                }
            }
            return decimal(-mq, c, 0, out, i);
        }
        if (t == 0) {
            return ascii("0.0", out, i);
        }
        return t < C_TINY ? decimal(Q_MIN, 10 * t, -1, out, i) : decimal(Q_MIN, t, 0, out, i);
    }

    /**
     * The shortest decimal in the rounding interval of {@code c 2^q}, written as {@code f 10^e}:
     * Schubfach's steps. {@code dk} corrects the exponent when the significand was scaled by ten.
     */
    private static int decimal(int q, long c, int dk, byte[] out, int at) {
        int odd = (int) c & 0x1;
        long cb = c << 2;
        long cbr = cb + 2;
        long cbl;
        int k;
        if (c != C_MIN || q == Q_MIN) {
            cbl = cb - 2;
            k = floorLog10Pow2(q);
        } else {
            // The interval below a power of two is half as wide.
            cbl = cb - 1;
            k = floorLog10ThreeQuartersPow2(q);
        }
        int h = q + floorLog2Pow10(-k) + 2;
        long g1 = G[(k - K_MIN) << 1];
        long g0 = G[(k - K_MIN) << 1 | 1];
        long vb = roundToOdd(g1, g0, cb << h);
        long vbl = roundToOdd(g1, g0, cbl << h);
        long vbr = roundToOdd(g1, g0, cbr << h);
        long s = vb >> 2;
        if (s >= 100) {
            // One digit fewer, when a multiple of ten lies in the interval.
            long sp10 = 10 * Math.multiplyHigh(s, TENTH);
            long tp10 = sp10 + 10;
            boolean upin = vbl + odd <= sp10 << 2;
            boolean wpin = (tp10 << 2) + odd <= vbr;
            if (upin != wpin) {
                return layout(upin ? sp10 : tp10, k, out, at);
            }
        }
        long t = s + 1;
        boolean uin = vbl + odd <= s << 2;
        boolean win = (t << 2) + odd <= vbr;
        if (uin != win) {
            return layout(uin ? s : t, k + dk, out, at);
        }
        long cmp = vb - (s + t << 1);
        return layout(cmp < 0 || cmp == 0 && (s & 0x1) == 0 ? s : t, k + dk, out, at);
    }

    /** The product of the 126-bit {@code g1 2^63 + g0} and {@code cp}, over 2^127, rounded to odd. */
    private static long roundToOdd(long g1, long g0, long cp) {
        long x1 = Math.multiplyHigh(g0, cp);
        long y0 = g1 * cp;
        long y1 = Math.multiplyHigh(g1, cp);
        long z = (y0 >>> 1) + x1;
        long vbp = y1 + (z >>> 63);
        return vbp | (z & MASK_63) + MASK_63 >>> 63;
    }

    /**
     * Writes {@code f 10^e} in {@link Double#toString}'s layout: plain from 10^-3 up to below 10^7,
     * computerised scientific notation otherwise, at least one digit after the point.
     */
    private static int layout(long f, int e, byte[] out, int at) {
        int len = floorLog10Pow2(Long.SIZE - Long.numberOfLeadingZeros(f));
        if (f >= POW10[len]) {
            len++;
        }
        // Now f 10^e = 0.d1...d17 10^exponent, with d1 != 0.
        long digits17 = f * POW10[H - len];
        int exponent = e + len;
        long high = digits17 / 100_000_000L;
        int low8 = (int) (digits17 - high * 100_000_000L);
        int first = (int) (high / 100_000_000L);
        int mid8 = (int) (high - first * 100_000_000L);
        int i = at;
        if (0 < exponent && exponent <= 7) {
            // The 17 digits, then the point moved in after the exponent-th, and a zero after the
            // point when no digit is left for it.
            int n = seventeenDigits(first, mid8, low8, out, i);
            if (n <= exponent) {
                out[i + exponent] = '.';
                out[i + exponent + 1] = '0';
                return i + exponent + 2;
            }
            for (int j = i + n; j > i + exponent; j--) {
                out[j] = out[j - 1];
            }
            out[i + exponent] = '.';
            return i + n + 1;
        }
        if (-3 < exponent && exponent <= 0) {
            out[i++] = '0';
            out[i++] = '.';
            for (int z = exponent; z < 0; z++) {
                out[i++] = '0';
            }
            return i + seventeenDigits(first, mid8, low8, out, i);
        }
        // d1 '.' d2...dn, or d1 ".0": the digits one place on, the first moved back before the point.
        int n = seventeenDigits(first, mid8, low8, out, i + 1);
        out[i] = out[i + 1];
        out[i + 1] = '.';
        i += n == 1 ? 2 : n + 1;
        if (n == 1) {
            out[i++] = '0';
        }
        out[i++] = 'E';
        int power = exponent - 1;
        if (power < 0) {
            out[i++] = '-';
            power = -power;
        }
        if (power >= 100) {
            out[i++] = (byte) ('0' + power / 100);
            power %= 100;
            out[i++] = DIGIT_PAIRS[2 * power];
        } else if (power >= 10) {
            out[i++] = DIGIT_PAIRS[2 * power];
        }
        out[i++] = (byte) ('0' + power % 10);
        return i;
    }

    /**
     * Writes the 17 digits {@code first, mid8, low8} from {@code at} and returns how many remain
     * once trailing zeros are dropped (at least one).
     */
    private static int seventeenDigits(int first, int mid8, int low8, byte[] out, int at) {
        out[at] = (byte) ('0' + first);
        eightDigits(mid8, out, at + 1);
        eightDigits(low8, out, at + 9);
        int n = 17;
        while (n > 1 && out[at + n - 1] == '0') {
            n--;
        }
        return n;
    }

    /** Writes the eight digits of {@code x} (below 10^8, leading zeros included) from {@code at}, two at a time. */
    private static void eightDigits(int x, byte[] out, int at) {
        int rest = x;
        for (int j = at + 6; j >= at; j -= 2) {
            int quotient = rest / 100;
            int pair = 2 * (rest - 100 * quotient);
            out[j] = DIGIT_PAIRS[pair];
            out[j + 1] = DIGIT_PAIRS[pair + 1];
            rest = quotient;
        }
    }

    private static int ascii(String text, byte[] out, int at) {
        for (int i = 0; i < text.length(); i++) {
            out[at + i] = (byte) text.charAt(i);
        }
        return at + text.length();
    }

    /** floor(e log10 2), for |e| up to about 5.4 million. */
    static int floorLog10Pow2(int e) {
        return (int) (e * 661_971_961_083L >> 41);
    }

    /** floor(e log10 2 + log10 3/4), for |e| up to about 5.4 million. */
    static int floorLog10ThreeQuartersPow2(int e) {
        return (int) (e * 661_971_961_083L + -274_743_187_321L >> 41);
    }

    /** floor(e log2 10), for |e| up to about 1.6 million. */
    static int floorLog2Pow10(int e) {
        return (int) (e * 913_124_641_741L >> 38);
    }

    private static byte[] digitPairs() {
        byte[] pairs = new byte[200];
        for (int i = 0; i < 100; i++) {
            pairs[2 * i] = (byte) ('0' + i / 10);
            pairs[2 * i + 1] = (byte) ('0' + i % 10);
        }
        return pairs;
    }

    private static long[] powersOfTen() {
        long[] powers = new long[H + 2];
        powers[0] = 1;
        for (int i = 1; i < powers.length; i++) {
            powers[i] = 10 * powers[i - 1];
        }
        return powers;
    }

    /**
     * For each k, 10^-k = beta 2^r with 2^125 <= beta < 2^126; g = floor(beta) + 1, split into its
     * high and low 63 bits. r is {@code floorLog2Pow10(-k) - 125}, which {@link #decimal} relies on;
     * the table is checked against it as it is built.
     */
    static long[] scaledPowersOfTen() {
        long[] g = new long[2 * (K_MAX - K_MIN + 1)];
        for (int k = K_MIN; k <= K_MAX; k++) {
            int r = floorLog2Pow10(-k) - 125;
            BigInteger beta = k <= 0
                    ? shift(BigInteger.TEN.pow(-k), -r)
                    : BigInteger.ONE.shiftLeft(-r).divide(BigInteger.TEN.pow(k));
            if (beta.bitLength() != 126) {
                throw new IllegalStateException("10^" + (-k) + " scaled by 2^" + (-r) + " has " + beta.bitLength() + " bits, not 126");
            }
            BigInteger plusOne = beta.add(BigInteger.ONE);
            g[(k - K_MIN) << 1] = plusOne.shiftRight(63).longValueExact();
            g[(k - K_MIN) << 1 | 1] = plusOne.longValue() & MASK_63;
        }
        return g;
    }

    private static BigInteger shift(BigInteger value, int left) {
        return left >= 0 ? value.shiftLeft(left) : value.shiftRight(-left);
    }
}
