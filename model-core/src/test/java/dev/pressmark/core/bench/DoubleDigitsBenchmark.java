package dev.pressmark.core.bench;

import com.fasterxml.jackson.core.io.NumberOutput;
import dev.pressmark.core.io.DoubleDigits;
import java.nio.charset.StandardCharsets;
import java.util.SplittableRandom;
import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Fork;
import org.openjdk.jmh.annotations.Level;
import org.openjdk.jmh.annotations.Measurement;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OperationsPerInvocation;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.Threads;
import org.openjdk.jmh.annotations.Warmup;

/**
 * Writing the numbers of scored rows as bytes: {@link DoubleDigits} against Jackson's
 * shortest-digit writer ({@code NumberOutput.toString(v, true)}, then the string's bytes), the
 * reference it must match digit for digit. 1,024 numbers as a scored table has them: per row a
 * score between -3 and 3 and four probabilities in (0, 1). Time per number.
 *
 * <pre>mvn -q -pl model-core -Pbench test-compile exec:exec -Djmh.args="DoubleDigitsBenchmark"</pre>
 */
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.NANOSECONDS)
@Warmup(iterations = 3, time = 2)
@Measurement(iterations = 5, time = 2)
@Fork(1)
@Threads(1)
public class DoubleDigitsBenchmark {

    private static final int NUMBERS = 1_024;

    @State(Scope.Benchmark)
    public static class Numbers {
        final double[] values = new double[NUMBERS];
        final byte[] out = new byte[NUMBERS * DoubleDigits.MAX_BYTES];

        @Setup(Level.Trial)
        public void setUp() {
            SplittableRandom random = new SplittableRandom(5);
            for (int i = 0; i < NUMBERS; i++) {
                values[i] = i % 5 == 0 ? random.nextDouble(-3, 3) : random.nextDouble();
            }
        }
    }

    @Benchmark
    @OperationsPerInvocation(NUMBERS)
    public int doubleDigits(Numbers numbers) {
        int at = 0;
        for (double v : numbers.values) {
            at = DoubleDigits.write(v, numbers.out, at);
        }
        return at;
    }

    @Benchmark
    @OperationsPerInvocation(NUMBERS)
    public int jackson(Numbers numbers) {
        int at = 0;
        for (double v : numbers.values) {
            byte[] digits = NumberOutput.toString(v, true).getBytes(StandardCharsets.US_ASCII);
            System.arraycopy(digits, 0, numbers.out, at, digits.length);
            at += digits.length;
        }
        return at;
    }
}
