package dev.pressmark.store.jdbc;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.IOException;
import java.net.URISyntaxException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;

/**
 * Opening a store skips Flyway when the history already records {@link StoreDatabase#SCHEMA_VERSION};
 * that is only right while the constant names the newest migration shipped.
 */
class SchemaVersionTest {

    private static final Pattern VERSIONED = Pattern.compile("V(\\d+)__.+\\.sql");

    @Test
    void the_schema_version_is_the_newest_migration_file() throws IOException, URISyntaxException {
        Path dir = Path.of(StoreDatabase.class.getClassLoader().getResource("db/migration").toURI());
        int newest = 0;
        try (Stream<Path> files = Files.list(dir)) {
            for (Path file : files.toList()) {
                Matcher m = VERSIONED.matcher(file.getFileName().toString());
                if (m.matches()) {
                    newest = Math.max(newest, Integer.parseInt(m.group(1)));
                }
            }
        }
        assertThat(newest).isPositive();
        assertThat(StoreDatabase.SCHEMA_VERSION).isEqualTo(newest);
    }
}
