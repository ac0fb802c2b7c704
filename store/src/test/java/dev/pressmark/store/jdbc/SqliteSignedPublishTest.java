package dev.pressmark.store.jdbc;

import java.nio.file.Path;
import java.sql.Connection;
import java.sql.DriverManager;
import java.sql.SQLException;
import org.junit.jupiter.api.io.TempDir;

class SqliteSignedPublishTest extends SignedPublishContract {

    @TempDir
    Path dir;

    @Override
    String freshStoreUrl() {
        return "sqlite:" + dir.resolve("store.db");
    }

    @Override
    Connection rawConnection() throws SQLException {
        return DriverManager.getConnection("jdbc:sqlite:" + dir.resolve("store.db"));
    }
}
