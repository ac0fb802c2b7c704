package dev.pressmark.store.jdbc;

import java.sql.Connection;
import java.sql.SQLException;

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
