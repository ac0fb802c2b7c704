package dev.pressmark.store.jdbc;

import static org.assertj.core.api.Assertions.assertThat;

import java.nio.file.Path;
import java.sql.Connection;
import java.sql.DriverManager;
import java.sql.ResultSet;
import java.sql.Statement;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * The crash trials ({@link CrashTrials}) on one SQLite file. SQLite's guarantee relied on is atomic
 * commit: a transaction is either wholly in the file or not at all after a crash, and a committed
 * one stays (sqlite.org, "Atomic Commit In SQLite"; in WAL mode, sqlite.org, "Write-Ahead
 * Logging"). At the end {@code PRAGMA integrity_check} must also say ok.
 */
@Tag("slow") // crash trials: SIGKILLed child processes
class SqliteCrashTest {

    static final long SEED = 20_261_202L;

    @TempDir
    Path dir;

    @Test
    void a_store_killed_fifty_times_in_publishes_and_fifty_in_activations_keeps_every_committed_version_whole() throws Exception {
        Path file = dir.resolve("crash.db");
        CrashTrials.Result result = new CrashTrials("sqlite:" + file, SEED, 4_000, 2_000).run();
        System.out.println("SQLite crash trials: " + result);
        assertThat(result.landings().get(CrashTrials.Landing.PUBLISH)).isGreaterThanOrEqualTo(CrashTrials.KILLS_PER_KIND);
        assertThat(result.landings().get(CrashTrials.Landing.ACTIVATE)).isGreaterThanOrEqualTo(CrashTrials.KILLS_PER_KIND);
        try (Connection c = DriverManager.getConnection("jdbc:sqlite:" + file);
                Statement s = c.createStatement(); ResultSet rs = s.executeQuery("PRAGMA integrity_check")) {
            rs.next();
            assertThat(rs.getString(1)).isEqualTo("ok");
        }
        // the children must have been writing when they died, or the test proves little
        assertThat(result.acknowledged()).isGreaterThan(result.trials());
    }
}
