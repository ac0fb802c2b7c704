package dev.pressmark.cli;

import dev.pressmark.core.PressmarkException;
import dev.pressmark.core.Progress;
import dev.pressmark.core.evaluate.Metric;
import dev.pressmark.core.train.BundleTrainer;
import dev.pressmark.core.train.LabelledData;
import dev.pressmark.core.train.TrainConfig;
import dev.pressmark.core.train.TrainPlan;
import dev.pressmark.demo.ListingTitles;
import dev.pressmark.server.BearerToken;
import dev.pressmark.server.PressmarkServer;
import dev.pressmark.server.ServerConfig;
import dev.pressmark.store.BundleStore;
import dev.pressmark.store.jdbc.JdbcStores;
import java.io.IOException;
import java.io.PrintStream;
import java.io.UncheckedIOException;
import java.io.Writer;
import java.nio.charset.StandardCharsets;
import java.nio.file.FileVisitResult;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.SimpleFileVisitor;
import java.nio.file.attribute.BasicFileAttributes;
import java.security.SecureRandom;
import java.time.Instant;
import java.time.temporal.ChronoUnit;
import java.util.Base64;
import java.util.List;
import java.util.Locale;
import java.util.Optional;

/**
 * The whole job on invented listings, in a store of its own: generate the titles, train one
 * version on whole words and one on WordPiece subwords, publish both, activate the second, and
 * serve them with a one-off admin token. {@link #close} stops the server and, unless the directory
 * was the caller's to keep, removes it.
 */
final class Demo implements AutoCloseable {

    static final String MODEL = "routing";
    static final String WORDS_TAG = "v1";
    static final String SUBWORDS_TAG = "v2";
    /** Enough rows that brands rarely repeat, few enough that both versions train in seconds on two cores. */
    static final int ROWS = 15_000;
    static final long SEED = 7;
    static final String ACTOR = "pressmark-demo";
    private static final int TOKEN_BYTES = 32;

    /** The demo's training config; the versions differ in the tokenizer, and v2 searches C. */
    private static final String CONFIG = """
            name: %s
            data: {file: listings.csv, text: [title], label: department}
            split: {test_fraction: 0.25, stratify: true, seed: %d}
            tokenizer: {kind: %s, vocab_size: 1000}
            features: {max_tokens: 800, weighting: tf, scaling: l2}
            classifier: {kind: linear-svm, c: 1.0, probabilities: platt}
            evaluation: {folds: 5}
            """;

    /** v2's small search: three values of C, one shared pipeline per fold, warm starts along C. */
    private static final String SEARCH = """
            search:
              grid: {classifier.c: [0.3, 1, 3]}
              metric: accuracy
              pick: one-se
            """;

    private final Path dir;
    private final boolean temporary;
    private final BundleStore store;
    private final PressmarkServer server;
    private final String adminToken;
    private volatile boolean closed;

    private Demo(Path dir, boolean temporary, BundleStore store, PressmarkServer server, String adminToken) {
        this.dir = dir;
        this.temporary = temporary;
        this.store = store;
        this.server = server;
        this.adminToken = adminToken;
    }

    /**
     * Builds the demo in {@code dir} (which must hold no store yet) and serves it on {@code port}
     * of 127.0.0.1; {@code temporary} says whether {@link #close} removes the directory.
     */
    static Demo start(Path dir, boolean temporary, int port, Progress progress, PrintStream log) {
        Path storeFile = dir.resolve("pressmark.db");
        if (Files.exists(storeFile)) {
            throw new PressmarkException("demo-store-exists", storeFile + " exists already; the demo builds its store afresh:"
                    + " choose another --keep directory or remove the file");
        }
        BundleStore store = null;
        try {
            Path data = writeListings(dir);
            log.printf(Locale.ROOT, "pressmark demo: %,d invented listing titles in %s%n", ROWS, data);
            byte[] words = train(data, "word", "v1, whole words", progress, log);
            byte[] subwords = train(data, "wordpiece", "v2, WordPiece subwords", progress, log);
            store = JdbcStores.open("sqlite:" + storeFile);
            store.publish(MODEL, WORDS_TAG, words, ACTOR);
            store.activate(MODEL, WORDS_TAG, ACTOR, "demo: the whole-word version first");
            store.publish(MODEL, SUBWORDS_TAG, subwords, ACTOR);
            store.activate(MODEL, SUBWORDS_TAG, ACTOR, "demo: subwords read unseen brands");
            String token = newToken();
            ServerConfig config = ServerConfig.defaults().withPort(port).withAdminToken(Optional.of(BearerToken.of(token)));
            PressmarkServer server = PressmarkServer.start(store, config);
            return new Demo(dir, temporary, store, server, token);
        } catch (RuntimeException e) {
            if (store != null) {
                store.close();
            }
            if (temporary) {
                delete(dir);
            }
            throw e;
        }
    }

    private static Path writeListings(Path dir) {
        Path file = dir.resolve("listings.csv");
        try (Writer out = Files.newBufferedWriter(file, StandardCharsets.UTF_8)) {
            ListingTitles.writeCsv(ListingTitles.generate(ROWS, SEED), out);
        } catch (IOException e) {
            throw new PressmarkException("file-unwritable", file + ": cannot write: " + e.getMessage(), e);
        }
        return file;
    }

    private static byte[] train(Path data, String tokenizer, String what, Progress progress, PrintStream log) {
        String yaml = String.format(Locale.ROOT, CONFIG, MODEL, SEED, tokenizer) + (tokenizer.equals("wordpiece") ? SEARCH : "");
        TrainPlan plan = TrainPlan.parse(yaml, "the demo's config");
        TrainConfig config = plan.config();
        LabelledData rows = LabelledData.read(data, config.data().text(), config.data().label(), false);
        log.println("pressmark demo: training " + what);
        BundleTrainer.Trained trained = BundleTrainer.train(plan, rows, Instant.now().truncatedTo(ChronoUnit.SECONDS), progress);
        log.printf(Locale.ROOT, "pressmark demo: %s: test accuracy %.3f%n", what,
                trained.result().test().overall().get(Metric.ACCURACY));
        return trained.bytes();
    }

    /** 32 random bytes, base64url without padding: 256 bits, safe in a header and a shell. */
    static String newToken() {
        byte[] bytes = new byte[TOKEN_BYTES];
        new SecureRandom().nextBytes(bytes);
        return Base64.getUrlEncoder().withoutPadding().encodeToString(bytes);
    }

    int port() {
        return server.port();
    }

    String baseUrl() {
        return "http://" + ServerConfig.DEFAULT_HOST + ":" + port();
    }

    String adminToken() {
        return adminToken;
    }

    Path dir() {
        return dir;
    }

    /** What a person needs to try the demo: where to look, the token, and commands to paste. */
    List<String> instructions() {
        String base = baseUrl();
        String item = "'{\"items\":[{\"title\":\"Quorubwick service kit 3/4in\"}]}'";
        return List.of(
                "console:  " + base + "/",
                "API docs: " + base + "/docs",
                "admin token (this run only): " + adminToken,
                "",
                "predict with the active version (" + SUBWORDS_TAG + "):",
                "  curl -s -H 'Content-Type: application/json' -d " + item + " " + base + "/models/" + MODEL + "/predict",
                "which subwords pushed the prediction:",
                "  curl -s -H 'Content-Type: application/json' -d " + item + " " + base + "/models/" + MODEL + "/explain",
                "roll back to the whole-word version (" + WORDS_TAG + "):",
                "  curl -s -X POST -H 'Authorization: Bearer " + adminToken + "' " + base + "/models/" + MODEL + "/rollback");
    }

    @Override
    public synchronized void close() {
        if (closed) {
            return;
        }
        closed = true;
        server.close();
        store.close();
        if (temporary) {
            delete(dir);
        }
    }

    private static void delete(Path dir) {
        if (!Files.exists(dir)) {
            return;
        }
        try {
            Files.walkFileTree(dir, new SimpleFileVisitor<>() {
                @Override
                public FileVisitResult visitFile(Path file, BasicFileAttributes attributes) throws IOException {
                    Files.delete(file);
                    return FileVisitResult.CONTINUE;
                }

                @Override
                public FileVisitResult postVisitDirectory(Path directory, IOException e) throws IOException {
                    if (e != null) {
                        throw e;
                    }
                    Files.delete(directory);
                    return FileVisitResult.CONTINUE;
                }
            });
        } catch (IOException e) {
            throw new UncheckedIOException("cannot remove the demo's directory " + dir, e);
        }
    }
}
