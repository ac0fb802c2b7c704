package dev.pressmark.core.bench;

import dev.pressmark.core.Progress;
import dev.pressmark.core.reference.MailCorpus;
import dev.pressmark.core.text.TextNormalizer;
import dev.pressmark.core.tokenize.WordCounts;
import dev.pressmark.core.tokenize.WordPieceTrainer;
import dev.pressmark.core.tokenize.WordPieceVocabulary;
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
import org.openjdk.jmh.annotations.Warmup;

/**
 * Vocabulary training on the mail bodies, single thread, end to end: normalise and count the
 * words of all 6,046 bodies, then learn the merges. {@code countWords} alone shows how the time
 * splits.
 *
 * <pre>mvn -q -pl model-core -Pbench test-compile exec:exec -Djmh.args="TrainBenchmark"</pre>
 */
@BenchmarkMode(Mode.SingleShotTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
@Warmup(iterations = 1)
@Measurement(iterations = 3)
@Fork(value = 1, jvmArgsAppend = "-Xmx8g")
public class TrainBenchmark {

    /** The mail bodies, loaded once. */
    @State(Scope.Benchmark)
    public static class Corpus {
        @Param({"8000", "30000"})
        public int vocabularySize;

        List<String> bodies;

        @Setup(Level.Trial)
        public void setUp() {
            bodies = MailCorpus.bodies();
        }
    }

    @Benchmark
    public WordPieceVocabulary train(Corpus corpus) {
        WordCounts counts = countWords(corpus);
        return new WordPieceTrainer(new WordPieceTrainer.Config(corpus.vocabularySize)).train(counts, Progress.NONE);
    }

    @Benchmark
    public WordCounts countWords(Corpus corpus) {
        WordCounts counts = new WordCounts(TextNormalizer.DEFAULT);
        for (String body : corpus.bodies) {
            counts.addText(body);
        }
        return counts;
    }
}
