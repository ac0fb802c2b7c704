package dev.pressmark.store.jdbc;

import java.sql.Connection;
import java.sql.SQLException;
import org.junit.jupiter.api.Tag;

@Tag("slow") // starts an embedded PostgreSQL, about 10 s
class PostgresSignedPublishTest extends SignedPublishContract {

    private final String[] schema = new String[1];

    @Override
    String freshStoreUrl() throws SQLException {
        return EmbeddedPostgresServer.freshSchemaUrl(schema);
    }

    @Override
    Connection rawConnection() throws SQLException {
        return EmbeddedPostgresServer.connection(schema[0]);
    }
}
