package dev.pressmark.spark;

import dev.pressmark.core.Progress;
import dev.pressmark.core.train.BundleTrainer;
import dev.pressmark.core.train.LabelledData;
import dev.pressmark.core.train.TrainPlan;
import dev.pressmark.demo.ListingTitles;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.io.Writer;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Map;

/**
 * Real bundles trained on the demo's invented listing titles, as {@code pressmark train} makes
 * them: a WordPiece model with Platt probabilities and a whole-word one without.
 */
final class TrainedBundles {

    static final long SEED = 7;
    /** Enough rows for every department in both folds; few enough to train in about a second. */
    static final int ROWS = 3_000;
    private static final Instant CREATED = Instant.parse("2026-01-01T00:00:00Z");

    private static final String CONFIG = """
            name: routing
            data: {file: listings.csv, text: [title], label: department}
            split: {test_fraction: 0.25, stratify: true, seed: %d}
            tokenizer: %s
            features: {max_tokens: 800, weighting: tf, scaling: l2}
            classifier: {kind: linear-svm, c: 1.0, probabilities: %s}
            evaluation: {folds: 2}
            """;

    private TrainedBundles() {
    }

    /** WordPiece subwords and Platt probabilities, as the demo's v2. */
    static byte[] subwords(Path dir) {
        return train(dir, "{kind: wordpiece, vocab_size: 600}", "platt");
    }

    /** Whole words and character n-grams, without probabilities. */
    static byte[] wordsWithoutProbabilities(Path dir) {
        return train(dir, "[{kind: words}, {kind: char-ngrams, min_n: 2, max_n: 3}]", "none");
    }

    /**
     * As {@link #subwords}, trained on the same titles with each department renamed by
     * {@code labels} (departments it does not name keep their own name).
     */
    static byte[] subwordsWithLabels(Path dir, Map<String, String> labels) {
        try {
            Path data = dir.resolve("relabelled.csv");
            try (Writer out = Files.newBufferedWriter(data, StandardCharsets.UTF_8)) {
                out.write("title,department\r\n");
                for (ListingTitles.Listing listing : ListingTitles.generate(ROWS, SEED)) {
                    String label = labels.getOrDefault(listing.department(), listing.department());
                    out.write(quoted(listing.title()) + "," + quoted(label) + "\r\n");
                }
            }
            return trainOn(data, "{kind: wordpiece, vocab_size: 600}", "platt");
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /** Titles the bundles have never seen: the same generator under another seed. */
    static List<String> unseenTitles(int count) {
        List<String> titles = new ArrayList<>(count);
        for (ListingTitles.Listing listing : ListingTitles.generate(count, SEED + 1000)) {
            titles.add(listing.title());
        }
        return titles;
    }

    private static byte[] train(Path dir, String tokenizer, String probabilities) {
        try {
            Path data = dir.resolve("listings.csv");
            if (!Files.exists(data)) {
                try (Writer out = Files.newBufferedWriter(data, StandardCharsets.UTF_8)) {
                    ListingTitles.writeCsv(ListingTitles.generate(ROWS, SEED), out);
                }
            }
            return trainOn(data, tokenizer, probabilities);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /** RFC 4180: in quotes, a quote doubled. */
    static String quoted(String value) {
        return '"' + value.replace("\"", "\"\"") + '"';
    }

    private static byte[] trainOn(Path data, String tokenizer, String probabilities) {
        TrainPlan plan = TrainPlan.parse(String.format(Locale.ROOT, CONFIG, SEED, tokenizer, probabilities), "test config");
        LabelledData rows = LabelledData.read(data, plan.config().data().text(), plan.config().data().label(), false);
        return BundleTrainer.train(plan, rows, CREATED, Progress.NONE).bytes();
    }
}
