package dev.pressmark.server;

import static org.assertj.core.api.Assertions.assertThat;

import dev.pressmark.cli.Main;
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
 * {@code pressmark} in a child JVM, as an operator runs it: {@link #serve} starts a service and
 * reads its port from the line it prints; {@link #run} runs a command to its end.
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
        List<String> args = new ArrayList<>(List.of("serve", "--port", "0", "--store", storeUrl));
        args.addAll(List.of(extraArgs));
        Process process = start(dir, env, args.toArray(String[]::new));
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

    /** Runs a {@code pressmark} command to its end; returns its exit code, with its stderr on failure. */
    static int run(Path dir, String... args) {
        Process process = start(dir, Map.of(), args);
        CompletableFuture<String> err = collect(process);
        try {
            process.getOutputStream().close();
            if (!process.waitFor(STARTED_WITHIN.toSeconds(), TimeUnit.SECONDS)) {
                stop(process);
                throw new AssertionError("pressmark " + String.join(" ", args) + " did not finish in " + STARTED_WITHIN);
            }
            int code = process.exitValue();
            if (code != 0) {
                throw new AssertionError("pressmark " + String.join(" ", args) + " exited with " + code + ":\n" + err.join());
            }
            return code;
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new AssertionError("interrupted", e);
        }
    }

    /** What a finished {@code pressmark} command printed, and its exit code. */
    record Finished(int exitCode, String out, String err) {
    }

    /** Runs a {@code pressmark} command to its end, whatever its exit code, and keeps both outputs. */
    static Finished runCapturing(Path dir, String... args) {
        Process process = start(dir, Map.of(), args);
        CompletableFuture<String> err = collect(process);
        CompletableFuture<String> out = CompletableFuture.supplyAsync(() -> {
            try (ByteArrayOutputStream buffer = new ByteArrayOutputStream()) {
                process.getInputStream().transferTo(buffer);
                return buffer.toString(StandardCharsets.UTF_8);
            } catch (IOException e) {
                throw new UncheckedIOException(e);
            }
        });
        try {
            process.getOutputStream().close();
            if (!process.waitFor(STARTED_WITHIN.toSeconds(), TimeUnit.SECONDS)) {
                stop(process);
                throw new AssertionError("pressmark " + String.join(" ", args) + " did not finish in " + STARTED_WITHIN);
            }
            return new Finished(process.exitValue(), out.join(), err.join());
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new AssertionError("interrupted", e);
        }
    }

    private static Process start(Path dir, Map<String, String> env, String... args) {
        List<String> command = new ArrayList<>(List.of(Path.of(System.getProperty("java.home"), "bin", "java").toString(),
                // start-up dominates these short runs on two cores; the client compiler alone gets there sooner
                "-XX:TieredStopAtLevel=1", "-XX:+UseSerialGC",
                "-cp", System.getProperty("java.class.path"), Main.class.getName()));
        command.addAll(List.of(args));
        ProcessBuilder builder = new ProcessBuilder(command).directory(dir.toFile());
        builder.environment().remove("PRESSMARK_ADMIN_TOKEN");
        builder.environment().remove("PRESSMARK_STORE");
        builder.environment().putAll(env);
        try {
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
