package dev.pressmark.store.jdbc;

import static org.assertj.core.api.Assertions.assertThat;

import dev.pressmark.store.StoreException;
import java.sql.SQLException;
import java.sql.SQLTransientConnectionException;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

/**
 * How a failed statement is reported, by its SQLSTATE. The codes and their names are PostgreSQL's
 * (PostgreSQL documentation, Appendix A, "PostgreSQL Error Codes"); class 08 is the SQL standard's.
 */
class StoreFailureTest {

    private static final StoreUrl POSTGRES = StoreUrl.parse("jdbc:postgresql://127.0.0.1:5432/pressmark?user=svc", Map.of());
    private static final StoreUrl SQLITE = StoreUrl.parse("sqlite:/tmp/pressmark-never-opened.db", Map.of());

    @ParameterizedTest(name = "{0} ({1}) on PostgreSQL is {2}")
    @CsvSource({
        "08001, sqlclient_unable_to_establish_sqlconnection, store-unreachable",
        "08006, connection_failure, store-unreachable",
        "57P01, admin_shutdown, store-unreachable",
        "57P02, crash_shutdown, store-unreachable",
        "57P03, cannot_connect_now, store-unreachable",
        "53100, disk_full, store-full",
        "42P01, undefined_table, store-failure",
        "57014, query_canceled, store-failure",
        "23505, unique_violation, store-failure",
    })
    void a_postgresql_state_maps_to_its_code(String state, String name, String code) {
        StoreException e = Transactions.failure(POSTGRES, "read the versions", new SQLException("ERROR: " + name, state));
        assertThat(e.code()).isEqualTo(code);
        assertThat(e.getMessage()).contains("127.0.0.1:5432/pressmark");
    }

    @ParameterizedTest(name = "{0} on SQLite is store-failure")
    @CsvSource({"57P01", "08006"})
    void the_connection_states_mean_nothing_on_sqlite(String state) {
        assertThat(Transactions.failure(SQLITE, "read the versions", new SQLException("[SQLITE_ERROR]", state)).code())
                .isEqualTo(StoreException.FAILURE);
    }

    @Test
    void the_pools_timeout_waiting_for_a_connection_on_postgresql_is_unreachable() {
        // the message is the pool's (HikariCP) when no connection comes within its timeout
        SQLException timeout = new SQLTransientConnectionException("pressmark - Connection is not available, request timed out after 10000ms.");
        assertThat(Transactions.failure(POSTGRES, "read the versions", timeout).code())
                .isEqualTo(StoreException.UNREACHABLE);
    }
}
