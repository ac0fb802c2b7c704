package dev.pressmark.cli;

import dev.pressmark.core.PressmarkException;
import dev.pressmark.core.bundle.Bundle;
import dev.pressmark.core.io.AtomicFiles;
import dev.pressmark.store.BundleStore;
import dev.pressmark.store.LoadedBundle;
import dev.pressmark.store.Version;
import java.io.BufferedOutputStream;
import java.io.IOException;
import java.io.OutputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.Callable;
import picocli.CommandLine;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

/**
 * {@code pressmark predict}: local predictions from a bundle file or a stored version, as CSV or
 * JSON. A CSV file is streamed: read, scored on several threads and written in bounded chunks, in
 * input order; {@code --out} appears only when complete.
 */
@Command(name = "predict", mixinStandardHelpOptions = true,
        description = {"Predict with a bundle or a stored version: texts on the command line (models with one input field) or the rows of a CSV file.",
            "A CSV file is streamed in constant memory; the output has its columns, then label, score and p:<label> per label"
                + " when the model gives probabilities."})
final class PredictCommand implements Callable<Integer> {

    private static final int OUTPUT_BUFFER_BYTES = 1 << 16;

    @Parameters(index = "0", arity = "0..1", paramLabel = "BUNDLE", description = "The bundle file (none with --model).")
    String bundle;

    @Parameters(index = "1..*", arity = "0..*", paramLabel = "TEXT", description = "Texts to classify, one item each.")
    List<String> texts = new ArrayList<>();

    @Option(names = "--model", paramLabel = "NAME[:TAG]",
            description = "Score with a version from the store (--store): TAG, or the active version; its checksum is verified.")
    String storedModel;

    @Mixin
    StoreOption store;

    @Option(names = "--data", paramLabel = "FILE", description = "A CSV file with a column for every input field.")
    Path data;

    @Option(names = "--out", paramLabel = "FILE", description = "Write here instead of stdout; the file appears only when complete.")
    Path out;

    @Option(names = "--force", description = "Replace the --out file if it exists.")
    boolean force;

    @Option(names = "--threads", paramLabel = "N", defaultValue = "0", description = "Scoring threads (default: ${DEFAULT-VALUE}, one per core); the output is the same at any count.")
    int threads;

    @Option(names = "--skip-bad-rows", description = "Leave out rows whose field count differs from the header's, and count them, instead of stopping at the first.")
    boolean skipBadRows;

    @CommandLine.Spec
    CommandLine.Model.CommandSpec spec;

    @Option(names = "--format", paramLabel = "FORMAT", defaultValue = "csv", description = "csv or json (default: ${DEFAULT-VALUE}).")
    String format;

    /** Rows per chunk; a seam for tests, which check that any size gives the same bytes. */
    int chunkRows = BatchScorer.DEFAULT_CHUNK_ROWS;

    @Override
    public Integer call() throws IOException {
        if (!format.equals("csv") && !format.equals("json")) {
            throw new PressmarkException("invalid-option", "--format must be csv or json, was \"" + format + "\"");
        }
        if (threads < 0) {
            throw new PressmarkException("invalid-option", "--threads must be >= 0 (0: one per core), was " + threads);
        }
        List<String> itemTexts = new ArrayList<>(texts);
        if (storedModel != null && bundle != null) {
            itemTexts.add(0, bundle);
        } else if (storedModel == null && bundle == null) {
            throw new CommandLine.ParameterException(spec.commandLine(), "give a BUNDLE file or --model NAME[:TAG]");
        }
        if ((data == null) == itemTexts.isEmpty()) {
            throw new CommandLine.ParameterException(spec.commandLine(), "give either TEXT... or --data FILE");
        }
        if (out != null && !force && Files.exists(out)) {
            throw new PressmarkException("file-exists", out + ": already exists; give --force to replace it");
        }
        Bundle model = storedModel == null ? Bundle.read(Path.of(bundle)) : loadStored();
        try (RowSource source = data != null ? CsvRowSource.open(data, model.inputFields(), skipBadRows) : texts(model, itemTexts)) {
            RowFormat rows = format.equals("json")
                    ? new JsonRowFormat(model.name(), model.labels(), model.hasProbabilities())
                    : new CsvRowFormat(source.columns(), model.labels(), model.hasProbabilities());
            BatchScorer scorer = new BatchScorer(model, new BatchScorer.Settings(
                    threads == 0 ? Runtime.getRuntime().availableProcessors() : threads, chunkRows));
            try (RowProgress progress = new RowProgress(System.err, data == null ? 0 : Files.size(data),
                    data != null && RowProgress.stderrIsTerminal())) {
                write(stream -> scorer.run(source, rows, stream, data == null ? (r, b) -> { } : progress));
                if (data != null) {
                    progress.finish(source.badRows().report());
                }
            }
        }
        return Main.EXIT_OK;
    }

    private static RowSource texts(Bundle model, List<String> texts) {
        List<String> fields = model.inputFields();
        if (fields.size() != 1) {
            throw new PressmarkException("needs-data", "this model reads " + fields.size() + " fields (" + String.join(", ", fields)
                    + "); give them as columns of a CSV file with --data");
        }
        return new TextRowSource(fields.get(0), texts);
    }

    /** The stored version, read through the store's checksum check, as the server loads it. */
    private Bundle loadStored() {
        int colon = storedModel.indexOf(':');
        String name = colon < 0 ? storedModel : storedModel.substring(0, colon);
        String tag = colon < 0 ? null : storedModel.substring(colon + 1);
        if (name.isEmpty() || (tag != null && tag.isEmpty())) {
            throw new PressmarkException("invalid-option", "--model must be NAME or NAME:TAG, was \"" + storedModel + "\"");
        }
        try (BundleStore opened = store.open()) {
            if (tag == null) {
                tag = opened.activeVersion(name).map(Version::tag).orElseThrow(() -> new PressmarkException("no-active-version",
                        "model \"" + name + "\" has no active version in " + opened.describe() + "; give --model " + name + ":TAG"));
            }
            LoadedBundle loaded = opened.load(name, tag);
            return Bundle.from(loaded.contents(), name + " " + tag);
        }
    }

    /** Runs {@code writer} on stdout, or on the --out file so that it appears only when complete. */
    private void write(AtomicFiles.Writer writer) throws IOException {
        if (out != null) {
            AtomicFiles.write(out, stream -> {
                OutputStream buffered = new BufferedOutputStream(stream, OUTPUT_BUFFER_BYTES);
                writer.write(buffered);
                buffered.flush();
            });
            return;
        }
        OutputStream buffered = new BufferedOutputStream(System.out, OUTPUT_BUFFER_BYTES);
        writer.write(buffered);
        buffered.flush();
        if (System.out.checkError()) {
            throw new PressmarkException("stdout-failed", "stdout: the output could not be written (closed or full)");
        }
    }
}
