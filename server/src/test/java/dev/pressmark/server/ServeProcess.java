package dev.pressmark.server;

import static org.assertj.core.api.Assertions.assertThat;

import dev.pressmark.cli.CommandRun;
import java.io.BufferedReader;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.InputStreamReader;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.TimeUnit;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

/**
 * {@code pressmark serve} in a child JVM, as an operator runs it: {@link #serve} starts a service
 * and reads its port from the line it prints. {@link CommandRun} runs the other commands to their end.
 */
public final class ServeProcess implements AutoCloseable {

    private static final Pattern LISTENING = Pattern.compile("serving on http://127\\.0\\.0\\.1:(\\d+)");
    private static final Duration STARTED_WITHIN = Duration.ofSeconds(60);
    private static final Duration STOPPED_WITHIN = Duration.ofSeconds(30);

    private final Process process;
    private final CompletableFuture<String> err;
    public final int port;
    final Http http;

    private ServeProcess(Process process, int port, CompletableFuture<String> err) {
        this.process = process;
        this.port = port;
        this.err = err;
        this.http = new Http(port);
    }

    /**
     * Starts {@code pressmark serve --port 0 --store URL}, then {@code extraArgs}, with {@code env}
     * added to the environment (and neither token nor store taken from this JVM's environment).
     */
    public static ServeProcess serve(Path dir, String storeUrl, Map<String, String> env, String... extraArgs) {
        return serve(dir, storeUrl, List.of(), env, extraArgs);
    }

    /** {@link #serve(Path, String, Map, String...)} in a JVM started with {@code jvmOptions} (such as {@code -Xmx256m}). */
    public static ServeProcess serve(Path dir, String storeUrl, List<String> jvmOptions, Map<String, String> env, String... extraArgs) {
        List<String> args = new ArrayList<>(List.of("serve", "--port", "0", "--store", storeUrl));
        args.addAll(List.of(extraArgs));
        Process process = start(dir, jvmOptions, env, args.toArray(String[]::new));
        CompletableFuture<String> err = collect(process);
        try {
            BufferedReader out = new BufferedReader(new InputStreamReader(process.getInputStream(), StandardCharsets.UTF_8));
            String line = CompletableFuture.supplyAsync(() -> {
                try {
                    return out.readLine();
                } catch (IOException e) {
                    throw new UncheckedIOException(e);
                }
            }).orTimeout(STARTED_WITHIN.toSeconds(), TimeUnit.SECONDS).join();
            assertThat(line).as("first line of stdout").isNotNull();
            Matcher m = LISTENING.matcher(line);
            assertThat(m.find()).as(line).isTrue();
            return new ServeProcess(process, Integer.parseInt(m.group(1)), err);
        } catch (RuntimeException | AssertionError e) {
            stop(process);
            throw new AssertionError("pressmark serve did not start; stderr:\n"
                    + err.completeOnTimeout("(not closed)", STOPPED_WITHIN.toSeconds(), TimeUnit.SECONDS).join(), e);
        }
    }

    private static Process start(Path dir, List<String> jvmOptions, Map<String, String> env, String... args) {
        try {
            ProcessBuilder builder = CommandRun.builder(dir, env, args);
            builder.command().addAll(1, jvmOptions); // right after the java executable
            return builder.start();
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    private static CompletableFuture<String> collect(Process process) {
        return CompletableFuture.supplyAsync(() -> {
            try (ByteArrayOutputStream buffer = new ByteArrayOutputStream()) {
                process.getErrorStream().transferTo(buffer);
                return buffer.toString(StandardCharsets.UTF_8);
            } catch (IOException e) {
                throw new UncheckedIOException(e);
            }
        });
    }

    private static void stop(Process process) {
        // Through the handle: Process.destroy() also closes the pipes, which can cut off the stderr reader mid-read.
        process.toHandle().destroy();
        try {
            if (!process.waitFor(STOPPED_WITHIN.toSeconds(), TimeUnit.SECONDS)) {
                process.destroyForcibly();
            }
        } catch (InterruptedException e) {
            process.destroyForcibly();
            Thread.currentThread().interrupt();
        }
    }

    /** A check that may throw anything. */
    @FunctionalInterface
    public interface Check {
        void run() throws Exception;
    }

    /**
     * Runs {@code check}; if it fails, the failure also carries what each of {@code services}
     * wrote to stderr (which stops them): their log says why they answered as they did, or did not
     * answer at all.
     */
    public static void explainingFailures(Check check, ServeProcess... services) throws Exception {
        try {
            check.run();
        } catch (AssertionError | Exception e) {
            StringBuilder logs = new StringBuilder(String.valueOf(e.getMessage()));
            for (int i = 0; i < services.length; i++) {
                logs.append("\n\nservice ").append(i + 1).append(" of ").append(services.length)
                        .append(", stderr:\n").append(services[i].stderr());
            }
            throw new AssertionError(logs.toString(), e);
        }
    }

    /** Stops the service if it still runs and returns all it wrote to stderr. */
    public String stderr() {
        stop(process);
        return err.completeOnTimeout("(stderr not closed within " + STOPPED_WITHIN + ")", STOPPED_WITHIN.toSeconds(), TimeUnit.SECONDS).join();
    }

    @Override
    public void close() {
        stop(process);
    }
}
