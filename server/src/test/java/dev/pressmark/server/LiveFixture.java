package dev.pressmark.server;

import dev.pressmark.core.bundle.Bundle;
import dev.pressmark.store.BundleStore;
import dev.pressmark.store.jdbc.JdbcStores;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Optional;

/**
 * A real server over a real SQLite store in a directory, serving a freshly trained model as
 * {@value #MODEL} {@value #TAG}: for checks that live outside this module (the generated
 * client), hence public. {@link #main} saves that server's live OpenAPI document to a file.
 */
public final class LiveFixture implements AutoCloseable {

    public static final String MODEL = "routing";
    public static final String TAG = "1.0.0";
    /** A second, hyphenated model, so that generated code meets a converted name too. */
    public static final String SECOND_MODEL = "shop-listings";

    private final BundleStore store;
    private final PressmarkServer server;
    private final List<String> labels;

    private LiveFixture(BundleStore store, PressmarkServer server, List<String> labels) {
        this.store = store;
        this.server = server;
        this.labels = labels;
    }

    /** Trains, publishes and activates the models in a store under {@code dir}, then starts a server on a free port. */
    public static LiveFixture start(Path dir) {
        byte[] bundle = TestBundles.svm();
        BundleStore store = JdbcStores.open("sqlite:" + dir.resolve("store.db"));
        try {
            for (String model : List.of(MODEL, SECOND_MODEL)) {
                store.publish(model, TAG, bundle, "fixture");
                store.activate(model, TAG, "fixture", "fixture");
            }
            PressmarkServer server = PressmarkServer.start(store, ServerConfig.defaults().withPort(0).withAccessLog(false)
                    .withAdminToken(Optional.of(BearerToken.of(Served.ADMIN))));
            return new LiveFixture(store, server, Bundle.read(bundle).labels());
        } catch (RuntimeException e) {
            store.close();
            throw e;
        }
    }

    public int port() {
        return server.port();
    }

    public String baseUri() {
        return "http://127.0.0.1:" + port();
    }

    /** The labels of the served bundle, as the bundle itself lists them. */
    public List<String> labels() {
        return labels;
    }

    /** The live document. */
    public String openApiJson() {
        try {
            HttpResponse<String> response = HttpClient.newHttpClient().send(HttpRequest.newBuilder(URI.create(baseUri() + "/openapi.json"))
                    .build(), HttpResponse.BodyHandlers.ofString());
            if (response.statusCode() != 200) {
                throw new IllegalStateException("GET /openapi.json answered " + response.statusCode() + ": " + response.body());
            }
            return response.body();
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new IllegalStateException("interrupted", e);
        }
    }

    @Override
    public void close() {
        server.close();
        store.close();
    }

    /** {@code LiveFixture STORE_DIR OUT.json}: saves the live document of a fixture server. */
    public static void main(String[] args) throws IOException {
        if (args.length != 2) {
            throw new IllegalArgumentException("usage: LiveFixture STORE_DIR OUT.json, had " + args.length + " arguments");
        }
        // A run of its own, so that an earlier run's store (its tags are immutable) does not get in the way.
        Path dir = Files.createTempDirectory(Files.createDirectories(Path.of(args[0])), "run-");
        Path out = Path.of(args[1]);
        if (out.getParent() != null) {
            Files.createDirectories(out.getParent());
        }
        try (LiveFixture fixture = start(dir)) {
            Files.writeString(out, fixture.openApiJson());
        }
    }
}
