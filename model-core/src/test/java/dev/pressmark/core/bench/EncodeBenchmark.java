package dev.pressmark.core.bench;

import dev.pressmark.core.reference.HuggingFaceReference;
import dev.pressmark.core.reference.MailCorpus;
import dev.pressmark.core.text.TextNormalizer;
import dev.pressmark.core.tokenize.IntList;
import dev.pressmark.core.tokenize.WordPieceEncoder;
import dev.pressmark.core.tokenize.WordPieceVocabulary;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Fork;
import org.openjdk.jmh.annotations.Level;
import org.openjdk.jmh.annotations.Measurement;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Param;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.TearDown;
import org.openjdk.jmh.annotations.Threads;
import org.openjdk.jmh.annotations.Warmup;

/**
 * Encoding throughput, one thread, ours against the Hugging Face reference through its Java
 * binding, with the same vocabulary (trained by us on the mail corpus). One operation encodes
 * every mail body of the corpus to ids, so both sides see exactly the same text; MB/s is the
 * corpus's UTF-8 size (printed at set-up) divided by the seconds per operation.
 *
 * <pre>mvn -q -pl model-core -Pbench test-compile exec:exec -Djmh.args="EncodeBenchmark"</pre>
 */
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
@Warmup(iterations = 2)
@Measurement(iterations = 3)
@Fork(value = 1, jvmArgsAppend = {"-Xmx4g", "-Dai.djl.offline=true"})
@Threads(1)
public class EncodeBenchmark {

    /** The corpus and both encoders, built once per vocabulary size. */
    @State(Scope.Benchmark)
    public static class Encoders {
        @Param({"8000", "30000"})
        public int vocabularySize;

        List<String> bodies;
        WordPieceEncoder ours;
        HuggingFaceReference reference;
        final IntList ids = new IntList(1 << 16);

        @Setup(Level.Trial)
        public void setUp() throws IOException {
            bodies = MailCorpus.bodies();
            long bytes = 0;
            for (String body : bodies) {
                bytes += body.getBytes(StandardCharsets.UTF_8).length;
            }
            System.out.printf("%ncorpus: %d mail bodies, %d UTF-8 bytes%n", bodies.size(), bytes);
            WordPieceVocabulary vocabulary = BenchVocabularies.trainedOnMailBodies(vocabularySize);
            ours = new WordPieceEncoder(vocabulary, TextNormalizer.DEFAULT, WordPieceEncoder.DEFAULT_MAX_WORD_CHARS);
            Path workDir = Files.createTempDirectory("pressmark-bench");
            reference = new HuggingFaceReference(vocabulary, TextNormalizer.DEFAULT, WordPieceEncoder.DEFAULT_MAX_WORD_CHARS, workDir);
        }

        @TearDown(Level.Trial)
        public void tearDown() {
            reference.close();
        }
    }

    @Benchmark
    public long pressmark(Encoders encoders) {
        long tokens = 0;
        for (String body : encoders.bodies) {
            encoders.ids.clear();
            encoders.ours.encodeIds(body, encoders.ids);
            tokens += encoders.ids.size();
        }
        return tokens;
    }

    @Benchmark
    public long reference(Encoders encoders) {
        long tokens = 0;
        for (String body : encoders.bodies) {
            tokens += encoders.reference.encodeIds(body).length;
        }
        return tokens;
    }
}
