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

    /** Overwrites page {@code page} (1-based) of the closed store file with zeros. */
    private void zeroPage(long page) throws Exception {
        try (java.nio.channels.FileChannel channel = java.nio.channels.FileChannel.open(file, java.nio.file.StandardOpenOption.WRITE)) {
            channel.write(java.nio.ByteBuffer.allocate(PAGE_BYTES), (page - 1) * PAGE_BYTES);
        }
    }

    /** SQLite's default page size (sqlite.org, "Database File Format", 1.3.2); the store does not change it. */
    private static final int PAGE_BYTES = 4096;

    @Test
    void a_zeroed_page_under_the_versions_table_fails_the_readiness_probe_though_the_model_list_still_answers() throws Exception {
        for (int i = 0; i < 40; i++) {
            store.publish("routing", "v" + i, TestBundles.bundle("routing", i), ACTOR);
        }
        store.activate("routing", "v0", ACTOR, "");
        store.probe();
        long root;
        try (Connection c = rawConnection(); Statement s = c.createStatement()) {
            s.execute("PRAGMA wal_checkpoint(TRUNCATE)");
            try (ResultSet rs = s.executeQuery("SELECT rootpage FROM sqlite_master WHERE type = 'table' AND name = 'versions'")) {
                rs.next();
                root = rs.getLong(1);
            }
            try (ResultSet rs = s.executeQuery("PRAGMA page_size")) {
                rs.next();
                assertThat(rs.getInt(1)).isEqualTo(PAGE_BYTES);
            }
        }
        store.close();
        zeroPage(root);
        store = BundleStore.open(url);
        // the list of models is answered from the index, which the zeroed page does not hold
        assertThat(store.models()).extracting(ModelSummary::name).containsExactly("routing");
        assertThatThrownBy(() -> store.versions("routing")).isInstanceOf(StoreException.class).hasMessageContaining("malformed");
        assertThatThrownBy(() -> store.probe()).isInstanceOf(StoreException.class).hasMessageContaining("malformed");
    }
}
