package dev.pressmark.cli;

import dev.pressmark.core.PressmarkException;
import dev.pressmark.core.bundle.HtmlReport;
import dev.pressmark.core.evaluate.DuplicateCounts;
import dev.pressmark.core.evaluate.MetricSummary;
import dev.pressmark.core.io.AtomicFiles;
import dev.pressmark.core.train.BundleTrainer;
import dev.pressmark.core.train.LabelledData;
import dev.pressmark.core.train.TrainConfig;
import dev.pressmark.core.train.TrainPlan;
import dev.pressmark.core.train.TrainingRun;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.util.Arrays;
import java.util.Locale;
import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;

/** {@code pressmark train}: train, cross-validate, test, and write a bundle and its report. */
@Command(
        name = "train",
        mixinStandardHelpOptions = true,
        description = {
            // each entry is one paragraph, and the first is the summary the command list shows: whole sentences
            "Train a classifier from a labelled CSV as train.yaml says and write the bundle FILE and its report FILE.html.",
            "The classifier is cross-validated on the training part and tested once on the held-out part.",
            "The bundle's created time is SOURCE_DATE_EPOCH when set, else the data file's modification time,"
                    + " so the same config on the same data gives the same bytes.",
            "With a search section, the grid's candidates are cross-validated on the training part;"
                    + " the chosen one is trained on the whole training part and tested once."
        })
final class TrainCommand implements Callable<Integer> {

    @Option(names = "--config", required = true, paramLabel = "FILE", description = "The training config (YAML).")
    Path config;

    @Option(names = "--out", paramLabel = "FILE", description = "The bundle to write (default: <name>.pmb beside the config).")
    Path out;

    @Option(names = "--test-data", paramLabel = "FILE", description = "Test on the rows of this labelled CSV (same "
            + "columns as the data) instead of holding out split.test_fraction; every data row then trains.")
    Path testData;

    @Option(names = "--assignments", paramLabel = "FILE", description = "Also write where every data row went: a CSV with "
            + "columns row (1-based data row number), part (train or test) and fold (1..k in the first repeat, empty for test rows).")
    Path assignments;

    @Override
    public Integer call() throws IOException {
        TrainPlan plan = TrainPlan.read(config);
        TrainConfig trainConfig = plan.config();
        Path dataFile = Path.of(trainConfig.data().file());
        LabelledData data = LabelledData.read(dataFile, trainConfig.data());
        System.err.printf(Locale.ROOT, "pressmark: %s: %,d rows%s%n", dataFile, data.rows(),
                data.droppedRows() > 0 ? String.format(Locale.ROOT, ", %,d incomplete rows left out", data.droppedRows()) : "");
        Instant created = created(dataFile);
        ConsoleProgress progress = new ConsoleProgress(System.err);
        BundleTrainer.Trained trained = testData == null ? BundleTrainer.train(plan, data, created, progress)
                : BundleTrainer.train(plan, data, testData(trainConfig), created, progress);
        TrainingRun.Result result = trained.result();
        if (result.duplicates().droppedRows() > 0) {
            System.err.printf(Locale.ROOT, "pressmark: data.duplicates: drop left out %,d rows that repeat an earlier row's text and"
                    + " label%n", result.duplicates().droppedRows());
        }
        byte[] bundle = trained.bytes();
        Path target = out != null ? out : config.toAbsolutePath().getParent().resolve(trainConfig.name() + ".pmb");
        Path report = target.resolveSibling(target.getFileName() + ".html");
        String html = HtmlReport.render(trained.bundle());
        AtomicFiles.write(target, stream -> stream.write(bundle));
        AtomicFiles.write(report, stream -> stream.write(html.getBytes(StandardCharsets.UTF_8)));
        if (assignments != null) {
            // the run's rows: the data file's rows it kept (data.duplicates: drop leaves repeats out), then any test file's
            int[] rowNumbers = trained.data().rowNumbers();
            int dataRows = testData == null ? rowNumbers.length : rowNumbers.length - result.testRows().length;
            AtomicFiles.write(assignments, stream -> stream.write(AssignmentsCsv.render(Arrays.copyOf(rowNumbers, dataRows),
                    result.foldOfRow()).getBytes(StandardCharsets.UTF_8)));
        }
        if (result.search() != null) {
            System.out.print(SearchTable.render(result.search().summary()));
            System.out.println();
        }
        warnAboutLeakage(result.duplicates(), testData != null);
        printSummary(result);
        System.err.println("pressmark: wrote " + target + " and " + report + (assignments == null ? "" : " and " + assignments));
        return Main.EXIT_OK;
    }

    private LabelledData testData(TrainConfig trainConfig) {
        // the test file has the text, label and weight columns (its rows' groups do not matter)
        LabelledData test = LabelledData.read(testData, trainConfig.data().text(), trainConfig.data().label(), null,
                trainConfig.data().weight(), trainConfig.data().dropIncomplete());
        System.err.printf(Locale.ROOT, "pressmark: %s: %,d test rows%s%n", testData, test.rows(),
                test.droppedRows() > 0 ? String.format(Locale.ROOT, ", %,d incomplete rows left out", test.droppedRows()) : "");
        return test;
    }

    /** One line on stderr when test rows repeat training texts, with what to do about it. */
    static void warnAboutLeakage(DuplicateCounts duplicates, boolean testFile) {
        if (duplicates.acrossSplit().texts() == 0) {
            return;
        }
        int texts = duplicates.acrossSplit().texts();
        int rows = duplicates.acrossSplit().rows();
        System.err.printf(Locale.ROOT, "pressmark: warning: %,d text%s on both sides of the split (%,d test row%s a"
                + " training text, so the test figures flatter the model); %s%n", texts, texts == 1 ? " is" : "s are",
                rows, rows == 1 ? " repeats" : "s repeat", testFile
                        ? "they come from --test-data, which no setting moves: remove them from one of the files"
                        : "set data.duplicates: group to keep identical texts on one side");
    }

    private static Instant created(Path dataFile) throws IOException {
        String epoch = System.getenv("SOURCE_DATE_EPOCH");
        if (epoch != null && !epoch.isBlank()) {
            try {
                return Instant.ofEpochSecond(Long.parseLong(epoch.strip()));
            } catch (NumberFormatException e) {
                throw new PressmarkException("invalid-environment", "SOURCE_DATE_EPOCH must be seconds since 1970, was \"" + epoch + "\"");
            }
        }
        return Files.getLastModifiedTime(dataFile).toInstant().truncatedTo(java.time.temporal.ChronoUnit.SECONDS);
    }

    private static void printSummary(TrainingRun.Result result) {
        System.out.printf(Locale.ROOT, "%-18s %-22s %s%n", "metric", "cross-validation", "test");
        for (MetricSummary summary : result.cv().metrics()) {
            double test = result.test().overall().has(summary.metric()) ? result.test().overall().get(summary.metric()) : Double.NaN;
            System.out.printf(Locale.ROOT, "%-18s %.3f ± %-14.3f %.3f%n", summary.metric().key(), summary.mean(), summary.standardError(), test);
        }
    }
}
