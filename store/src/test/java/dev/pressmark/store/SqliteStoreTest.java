package dev.pressmark.store;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.sql.Connection;
import java.sql.DriverManager;
import java.sql.ResultSet;
import java.sql.SQLException;
import java.sql.Statement;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class SqliteStoreTest extends BundleStoreContract {

    @TempDir
    Path dir;

    private Path file;

    @Override
    String freshStoreUrl() {
        file = dir.resolve("store.db");
        return "sqlite:" + file;
    }

    @Override
    Connection rawConnection() throws SQLException {
        return DriverManager.getConnection("jdbc:sqlite:" + file);
    }

    @Override
    String trueLiteral() {
        return "1";
    }

    @Test
    void the_store_file_is_in_wal_mode_with_foreign_keys_enforced() throws SQLException {
        try (Connection c = rawConnection(); Statement s = c.createStatement(); ResultSet rs = s.executeQuery("PRAGMA journal_mode")) {
            rs.next();
            assertThat(rs.getString(1)).isEqualTo("wal");
        }
        // an activation of a version that does not exist is refused by the foreign key, not only by the code
        assertThatThrownBy(() -> {
            try (Connection c = ((JdbcBundleStore) store).rawForTests(); Statement s = c.createStatement()) {
                s.executeUpdate("INSERT INTO activations (model, tag, activated_at, actor, reason, is_rollback) VALUES ('x', 'y', 0, 'a', '', 0)");
            }
        }).isInstanceOf(SQLException.class).hasMessageContaining("FOREIGN KEY");
    }

    @Test
    void the_jdbc_form_of_the_url_opens_the_same_file() {
        store.publish("routing", "a", TestBundles.bundle("routing", 1), ACTOR);
        store.close();
        store = BundleStore.open("jdbc:sqlite:" + file);
        assertThat(store.versions("routing")).hasSize(1);
    }

    @Test
    void a_file_that_is_not_a_database_is_refused() throws Exception {
        Path text = dir.resolve("notes.db");
        Files.writeString(text, "these are not the tables you are looking for\n", StandardCharsets.UTF_8);
        assertThatThrownBy(() -> BundleStore.open("sqlite:" + text))
                .isInstanceOf(StoreException.class).hasMessage(text + " is not a pressmark store: it is not an SQLite database");
        assertThat(Files.readString(text)).startsWith("these are");
    }

    @Test
    void a_directory_is_refused() {
        assertThatThrownBy(() -> BundleStore.open("sqlite:" + dir))
                .isInstanceOf(StoreException.class).hasMessage(dir + " is a directory, not a store file");
    }

    @Test
    void a_missing_directory_is_named() {
        Path missing = dir.resolve("no/such/dir/store.db");
        assertThatThrownBy(() -> BundleStore.open("sqlite:" + missing))
                .isInstanceOf(StoreException.class).hasMessageContaining("directory " + missing.getParent() + " does not exist");
    }

    @Test
    void a_read_only_location_is_refused_clearly() {
        // /proc refuses new files even to root, who ignores permission bits
        assertThatThrownBy(() -> BundleStore.open("sqlite:/proc/pressmark-store.db"))
                .isInstanceOf(StoreException.class)
                .hasMessageStartingWith("cannot open or create the store /proc/pressmark-store.db: the location is not writable")
                .extracting(e -> ((StoreException) e).code()).isEqualTo(StoreException.READ_ONLY);
    }
}
