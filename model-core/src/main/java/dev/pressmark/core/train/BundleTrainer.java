package dev.pressmark.core.train;

import dev.pressmark.core.Progress;
import dev.pressmark.core.bundle.Bundle;
import java.nio.file.Path;
import java.time.Instant;
import java.util.Objects;

/**
 * The one call that trains a bundle from a config: the run (split, cross-validation or search,
 * the final fit, the test part scored once) and the bundle assembled from it, returned with the
 * loaded model and what the run measured, so that a report needs no second reading of the bytes.
 * The command line, the demo and test fixtures all train through here.
 *
 * <p>Progress goes to the given {@link Progress}: a note naming the positive class of a binary
 * model, then the run's tasks.
 */
public final class BundleTrainer {

    private BundleTrainer() {
    }

    /**
     * A trained bundle.
     *
     * @param bytes the bundle file's bytes
     * @param bundle the model those bytes hold, ready to predict and to report on
     * @param result what the run measured (metrics, folds, search, row assignments, duplicate texts)
     * @param data the rows the run used, in the order of {@link TrainingRun.Result#foldOfRow}: the
     *     data's rows that {@code data.duplicates: drop} kept, then any test data's rows
     */
    public record Trained(byte[] bytes, Bundle bundle, TrainingRun.Result result, LabelledData data) {

        public Trained {
            Objects.requireNonNull(bytes, "bytes");
            Objects.requireNonNull(bundle, "bundle");
            Objects.requireNonNull(result, "result");
            Objects.requireNonNull(data, "data");
        }
    }

    /** Reads the config's data file ({@code data.file}) and trains on it as {@link #train(TrainPlan, LabelledData, Instant, Progress)}. */
    public static Trained train(TrainPlan plan, Instant created, Progress progress) {
        return train(plan, LabelledData.read(Path.of(plan.config().data().file()), plan.config().data()), created, progress);
    }

    /**
     * Trains on {@code data}, holding out the test part as the config's split says.
     * {@code created} goes into the manifest as is, so that the same inputs give the same bytes.
     */
    public static Trained train(TrainPlan plan, LabelledData data, Instant created, Progress progress) {
        return train(new TrainingRun(plan, data), plan.config(), created, progress);
    }

    /** Trains (and cross-validates) on every row of {@code data} and tests once on every row of {@code testData}. */
    public static Trained train(TrainPlan plan, LabelledData data, LabelledData testData, Instant created, Progress progress) {
        return train(TrainingRun.withTestData(plan, data, testData), plan.config(), created, progress);
    }

    private static Trained train(TrainingRun run, TrainConfig config, Instant created, Progress progress) {
        if (run.positiveClass() >= 0) {
            progress.note("positive class for binary metrics: " + run.labels().get(run.positiveClass()));
        }
        TrainingRun.Result result = run.run(progress);
        Bundle.Built built = BundleAssembler.build(config, run.data(), result, created);
        return new Trained(built.bytes(), built.bundle(), result, run.data());
    }
}
