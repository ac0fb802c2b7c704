package dev.pressmark.core.bench;

import dev.pressmark.core.Progress;
import dev.pressmark.core.reference.MailCorpus;
import dev.pressmark.core.train.BundleAssembler;
import dev.pressmark.core.train.DataConfig;
import dev.pressmark.core.train.EvaluationConfig;
import dev.pressmark.core.train.LabelledData;
import dev.pressmark.core.train.TokenizerConfig;
import dev.pressmark.core.train.TrainConfig;
import dev.pressmark.core.train.TrainingRun;
import dev.pressmark.core.feature.FeatureConfig;
import java.time.Instant;
import java.util.ArrayList;
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
 * A whole training run on the mail corpus, spam against ham, from rows in memory to bundle bytes:
 * split, cross-validation with per-fold vocabulary (8,000 subwords) and features, Platt
 * sigmoids, final fit, test, assembly. Run at 1 and 2 threads, the ratio is the parallel speed-up
 * of cross-validation.
 *
 * <pre>mvn -q -B -pl model-core -Pbench test-compile exec:exec -Djmh.args="TrainRunBenchmark"</pre>
 */
@BenchmarkMode(Mode.SingleShotTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
@Warmup(iterations = 1)
@Measurement(iterations = 2)
@Fork(value = 1, jvmArgsAppend = "-Xmx8g")
public class TrainRunBenchmark {

    /** The corpus as labelled rows and the config, built once. */
    @State(Scope.Benchmark)
    public static class Run {
        @Param({"5", "10"})
        public int folds;

        @Param({"1", "2"})
        public int threads;

        TrainConfig config;
        LabelledData data;

        @Setup(Level.Trial)
        public void setUp() {
            List<String[]> texts = new ArrayList<>();
            List<String> labels = new ArrayList<>();
            for (MailCorpus.Mail mail : MailCorpus.mails()) {
                texts.add(new String[] {mail.body()});
                labels.add(mail.spam() ? "spam" : "ham");
            }
            int[] lines = new int[labels.size()];
            for (int i = 0; i < lines.length; i++) {
                lines[i] = i + 2;
            }
            data = new LabelledData(List.of("body"), "label", texts, labels, lines, "0".repeat(64), 0);
            TrainConfig defaults = TrainConfig.parse("", "benchmark");
            TokenizerConfig tokenizer = TokenizerConfig.DEFAULT.withVocabSize(8000);
            config = new TrainConfig("mail", new DataConfig("mail.csv", List.of("body"), "label", "spam", false),
                    defaults.split(), tokenizer, FeatureConfig.defaults().withMaxTokens(5000), defaults.classifier(),
                    new EvaluationConfig(folds, 1, threads));
        }
    }

    @Benchmark
    public byte[] train(Run run) {
        TrainingRun.Result result = new TrainingRun(run.config, run.data).run(Progress.NONE);
        return BundleAssembler.assemble(run.config, run.data, result, Instant.EPOCH);
    }
}
