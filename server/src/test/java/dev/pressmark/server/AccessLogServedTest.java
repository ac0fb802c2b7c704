package dev.pressmark.server;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.ByteArrayOutputStream;
import java.io.OutputStream;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.time.Duration;
import java.util.List;
import java.util.Optional;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * The access log as the running service writes it: through SLF4J's simple binding, configured by
 * the service's simplelogger.properties, to standard error, which the test captures.
 */
class AccessLogServedTest {

    private static final String MARK = " INFO " + AccessLog.LOGGER + " - ";
    private static final String HEADER_SECRET = "header-secret-3";
    private static final String QUERY_SECRET = "query-secret-4";
    /** The request logger runs once the answer is on its way, so its line may come a moment after the answer. */
    private static final Duration SETTLE = Duration.ofSeconds(10);
    private static final long POLL_MS = 20;

    private static final byte[] svm = TestBundles.svm();

    @TempDir
    Path dir;

    private final ByteArrayOutputStream captured = new ByteArrayOutputStream();
    private PrintStream originalErr;

    @BeforeEach
    void capture() {
        originalErr = System.err;
        System.setErr(new PrintStream(new Tee(originalErr, captured), true, StandardCharsets.UTF_8));
    }

    @AfterEach
    void restore() {
        System.setErr(originalErr);
    }

    @Test
    void each_request_gives_one_line_with_its_fields_and_no_secret() throws InterruptedException {
        ServerConfig config = Served.config().withAccessLog(true)
                .withReaderToken(Optional.of(BearerToken.of(Served.READER)));
        String[] asReader = {"Authorization", "Bearer " + Served.READER, "X-Api-Key", HEADER_SECRET};
        try (Served s = Served.on(dir, config)) {
            s.serving(svm);
            int before = accessLines().size();
            assertThat(s.http.get("/health?token=" + QUERY_SECRET).status()).isEqualTo(200);
            assertThat(s.http.postJson("/models/routing/predict", "{\"items\":[{\"title\":\"aquaflow valve\"},{\"title\":\"volt amp\"}]}", asReader)
                    .status()).isEqualTo(200);
            assertThat(s.http.putJson("/models/routing/active", "{\"tag\":\"1.0.0\"}", "Authorization", "Bearer " + HEADER_SECRET).status())
                    .isEqualTo(401);
            // an encoded line break and a would-be second field in the path
            int odd = s.http.get("/models/a%0Ab/versions%0D%0A" + "2026-01-01T00:00:00Z%20INFO%20x", asReader).status();
            assertThat(s.http.get("/no/such%20place").status()).isEqualTo(404);

            List<String> lines = settled(before + 5).subList(before, before + 5);
            assertThat(lines.get(0)).matches("method=GET path=/health status=200 ms=\\d+\\.\\d\\d");
            assertThat(lines.get(1)).matches("method=POST path=/models/routing/predict status=200 ms=\\d+\\.\\d\\d model=routing version=1\\.0\\.0 items=2");
            assertThat(lines.get(2)).matches("method=PUT path=/models/routing/active status=401 ms=\\d+\\.\\d\\d model=routing");
            assertThat(lines.get(3)).matches("method=GET path=\\S+ status=" + odd + " ms=\\d+\\.\\d\\d")
                    .contains("path=/models/a%0Ab/versions%0D%0A2026-01-01T00:00:00Z%20INFO%20x ");
            assertThat(lines.get(4)).matches("method=GET path=/no/such%20place status=404 ms=\\d+\\.\\d\\d");
            String all = captured.toString(StandardCharsets.UTF_8);
            assertThat(all).doesNotContain(Served.READER, HEADER_SECRET, QUERY_SECRET, "aquaflow");
        }
    }

    @Test
    void turned_off_it_writes_no_line_while_the_requests_are_still_counted() throws InterruptedException {
        try (Served s = Served.on(dir, ServerConfig.defaults().withPort(0).withAccessLog(false))) {
            for (int i = 0; i < 3; i++) {
                assertThat(s.http.get("/health").status()).isEqualTo(200);
            }
            long deadline = System.nanoTime() + SETTLE.toNanos();
            double counted = 0;
            while (counted < 3 && System.nanoTime() < deadline) {
                Thread.sleep(POLL_MS);
                counted = Scrape.of(s.http.get("/metrics").body()).histograms("pressmark_http_requests_seconds").stream()
                        .filter(h -> h.getLabels().get("route").equals("/health")).mapToLong(h -> h.getSampleCount()).sum();
            }
            assertThat(counted).isEqualTo(3);
            assertThat(accessLines()).isEmpty();
        }
    }

    private List<String> settled(int expected) throws InterruptedException {
        long deadline = System.nanoTime() + SETTLE.toNanos();
        List<String> lines = accessLines();
        while (lines.size() < expected && System.nanoTime() < deadline) {
            Thread.sleep(POLL_MS);
            lines = accessLines();
        }
        assertThat(lines).as("access log lines").hasSize(expected);
        return lines;
    }

    /** The access log's messages, in order; any other line on standard error is left out. */
    private List<String> accessLines() {
        return captured.toString(StandardCharsets.UTF_8).lines().filter(l -> l.contains(MARK))
                .map(l -> l.substring(l.indexOf(MARK) + MARK.length())).toList();
    }

    /** Writes to both streams, so that the build's own output still shows what the service logged. */
    private static final class Tee extends OutputStream {
        private final OutputStream first;
        private final OutputStream second;

        Tee(OutputStream first, OutputStream second) {
            this.first = first;
            this.second = second;
        }

        @Override
        public synchronized void write(int b) throws java.io.IOException {
            first.write(b);
            second.write(b);
        }

        @Override
        public synchronized void write(byte[] b, int off, int len) throws java.io.IOException {
            first.write(b, off, len);
            second.write(b, off, len);
        }

        @Override
        public synchronized void flush() throws java.io.IOException {
            first.flush();
            second.flush();
        }
    }
}
