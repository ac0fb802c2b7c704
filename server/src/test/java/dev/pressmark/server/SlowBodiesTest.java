package dev.pressmark.server;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.IOException;
import java.io.OutputStream;
import java.net.InetAddress;
import java.net.Socket;
import java.net.SocketTimeoutException;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * The slow-body attack: 200 connections POST a predict with a chunked body and send one byte of
 * it at a time, a second apart. They must not take the threads that health, readiness and
 * metrics answer on, and each must be cut (408 or closed) within a bounded time rather than held
 * for as long as its sender goes on. Loopback only; the attack lasts {@link #ATTACK} at most.
 */
@Tag("slow")
class SlowBodiesTest {

    private static final int CONNECTIONS = 200;
    private static final Duration ATTACK = Duration.ofSeconds(16);
    private static final Duration BYTE_EVERY = Duration.ofSeconds(1);
    /** What a load balancer's probe may wait; the probes here are made while the attack goes on. */
    private static final Duration PROBE_WITHIN = Duration.ofSeconds(1);
    private static final String PREDICT = "/models/routing/predict";

    @TempDir
    Path dir;

    @Test
    void two_hundred_trickling_bodies_leave_health_readiness_and_metrics_answering_and_are_cut() throws Exception {
        byte[] bundle = TestBundles.train(4, "classifier: {kind: linear-svm, probabilities: platt}");
        try (Served s = Served.on(dir, ServerConfig.defaults().withPort(0).withAccessLog(false)).serving(bundle)) {
            List<Socket> slow = new ArrayList<>();
            try {
                for (int i = 0; i < CONNECTIONS; i++) {
                    Socket socket = new Socket(InetAddress.getLoopbackAddress(), s.server.port());
                    socket.setSoTimeout(1);
                    socket.getOutputStream().write(("POST " + PREDICT + " HTTP/1.1\r\nHost: 127.0.0.1\r\nContent-Type: application/json\r\n"
                            + "Transfer-Encoding: chunked\r\n\r\n1\r\n{\r\n").getBytes(StandardCharsets.US_ASCII));
                    slow.add(socket);
                }
                HttpClient probe = HttpClient.newBuilder().connectTimeout(PROBE_WITHIN).build();
                long end = System.nanoTime() + ATTACK.toNanos();
                int rounds = 0;
                long lastByte = System.nanoTime();
                while (System.nanoTime() < end) {
                    if (System.nanoTime() - lastByte >= BYTE_EVERY.toNanos()) {
                        trickle(slow);
                        lastByte = System.nanoTime();
                    }
                    for (String path : new String[] {"/health", "/health/ready", "/metrics"}) {
                        long start = System.nanoTime();
                        HttpResponse<String> answer = probe.send(HttpRequest.newBuilder(URI.create("http://127.0.0.1:" + s.server.port() + path))
                                .timeout(PROBE_WITHIN).build(), HttpResponse.BodyHandlers.ofString());
                        assertThat(answer.statusCode()).as(path + " during the attack, round " + rounds).isEqualTo(200);
                        assertThat(Duration.ofNanos(System.nanoTime() - start)).as(path).isLessThan(PROBE_WITHIN);
                    }
                    rounds++;
                    Thread.sleep(200);
                }
                assertThat(rounds).isGreaterThan(10);
                // Every trickling connection has been answered (busy, or cut for its rate) or closed by now.
                int stillOpen = 0;
                for (Socket socket : slow) {
                    stillOpen += answeredOrClosed(socket) ? 0 : 1;
                }
                assertThat(stillOpen).as("connections still held after " + ATTACK).isZero();
            } finally {
                for (Socket socket : slow) {
                    socket.close();
                }
            }
            assertThat(s.http.postJson(PREDICT, "{\"items\":[{\"title\":\"aqua valve\"}]}").status()).isEqualTo(200);
        }
    }

    @Test
    void a_trickling_body_is_answered_408_within_the_grace_and_its_slot_is_freed() throws Exception {
        byte[] bundle = TestBundles.train(4, "classifier: {kind: linear-svm, probabilities: platt}");
        try (Served s = Served.on(dir, ServerConfig.defaults().withPort(0).withMaxConcurrent(1).withAccessLog(false)).serving(bundle);
                Socket socket = new Socket(InetAddress.getLoopbackAddress(), s.server.port())) {
            socket.setSoTimeout(1);
            OutputStream out = socket.getOutputStream();
            out.write(("POST " + PREDICT + " HTTP/1.1\r\nHost: 127.0.0.1\r\nContent-Type: application/json\r\nContent-Length: 40\r\n\r\n{")
                    .getBytes(StandardCharsets.US_ASCII));
            long start = System.nanoTime();
            String answer = "";
            while (answer.isEmpty() && System.nanoTime() - start < Duration.ofSeconds(30).toNanos()) {
                Thread.sleep(1_000);
                try {
                    out.write(' ');
                } catch (IOException e) {
                    break; // closed after the answer
                }
                answer = readSome(socket);
            }
            if (answer.isEmpty()) {
                answer = readSome(socket);
            }
            assertThat(answer).startsWith("HTTP/1.1 408").contains(Problems.TYPE_PREFIX + "body-too-slow");
            assertThat(Duration.ofNanos(System.nanoTime() - start)).isLessThan(Duration.ofSeconds(Bodies.GRACE_MS / 1000 + 5));
            // the one admission slot came back
            assertThat(s.http.postJson(PREDICT, "{\"items\":[{\"title\":\"aqua valve\"}]}").status()).isEqualTo(200);
        }
    }

    private static void trickle(List<Socket> sockets) {
        for (Socket socket : sockets) {
            if (socket.isClosed()) {
                continue;
            }
            try {
                socket.getOutputStream().write("1\r\n \r\n".getBytes(StandardCharsets.US_ASCII));
            } catch (IOException e) {
                closeQuietly(socket); // the server closed it: that is one of the outcomes wanted
            }
        }
    }

    /** Whether the server has answered this connection or closed it. */
    private static boolean answeredOrClosed(Socket socket) {
        if (socket.isClosed()) {
            return true;
        }
        try {
            socket.setSoTimeout(200);
            socket.getInputStream().read();
            return true; // a byte of an answer, or the end of the stream
        } catch (SocketTimeoutException e) {
            return false;
        } catch (IOException e) {
            return true; // reset by the server
        }
    }

    private static String readSome(Socket socket) {
        try {
            socket.setSoTimeout(500);
            byte[] buffer = new byte[4096];
            int n = socket.getInputStream().read(buffer);
            return n <= 0 ? "" : new String(buffer, 0, n, StandardCharsets.UTF_8);
        } catch (IOException e) {
            return "";
        }
    }

    private static void closeQuietly(Socket socket) {
        try {
            socket.close();
        } catch (IOException e) {
            throw new java.io.UncheckedIOException(e);
        }
    }
}
