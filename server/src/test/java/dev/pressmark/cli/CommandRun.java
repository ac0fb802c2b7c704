package dev.pressmark.cli;

import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.InputStream;
import java.io.OutputStream;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.TimeUnit;

/**
 * Runs {@code pressmark} in a child JVM, as a user would, and collects its output and exit code.
 * {@link #builder} is the one place that says how such a child is started, for the commands run
 * to their end here and for the services that {@code ServeProcess} keeps running.
 */
public record CommandRun(int exitCode, String out, String err) {

    private static final long TIMEOUT_SECONDS = 120;

    /** With nothing on stdin. */
    public static CommandRun run(Path workDir, String... args) {
        return of(workDir, new byte[0], args);
    }

    static CommandRun of(Path workDir, String input, String... args) {
        return of(workDir, input.getBytes(StandardCharsets.UTF_8), args);
    }

    static CommandRun of(Path workDir, byte[] input, String... args) {
        return of(workDir, Map.of(), input, args);
    }

    /** With {@code env} added to the child's environment, as {@link #builder} says. */
    static CommandRun of(Path workDir, Map<String, String> env, byte[] input, String... args) {
        try {
            Process process = builder(workDir, env, args).start();
            CompletableFuture<byte[]> out = drain(process.getInputStream());
            CompletableFuture<byte[]> err = drain(process.getErrorStream());
            try (OutputStream stdin = process.getOutputStream()) {
                stdin.write(input);
            }
            if (!process.waitFor(TIMEOUT_SECONDS, TimeUnit.SECONDS)) {
                process.destroyForcibly();
                throw new AssertionError("pressmark " + String.join(" ", args) + " did not finish in " + TIMEOUT_SECONDS + " s");
            }
            return new CommandRun(process.exitValue(),
                    new String(out.join(), StandardCharsets.UTF_8), new String(err.join(), StandardCharsets.UTF_8));
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new AssertionError("interrupted", e);
        }
    }

    /**
     * A child JVM running {@code pressmark args} in {@code workDir}, with {@code env} added to its
     * environment. It never inherits this JVM's {@code PRESSMARK_STORE} or
     * {@code PRESSMARK_ADMIN_TOKEN}: a developer's own settings must not reach a test.
     */
    public static ProcessBuilder builder(Path workDir, Map<String, String> env, String... args) {
        List<String> command = new ArrayList<>(List.of(Path.of(System.getProperty("java.home"), "bin", "java").toString(),
                // start-up dominates these short runs on two cores; the client compiler alone gets there sooner
                "-XX:TieredStopAtLevel=1", "-XX:+UseSerialGC",
                "-cp", System.getProperty("java.class.path"), Main.class.getName()));
        command.addAll(List.of(args));
        ProcessBuilder builder = new ProcessBuilder(command).directory(workDir.toFile());
        builder.environment().remove("PRESSMARK_STORE");
        builder.environment().remove("PRESSMARK_ADMIN_TOKEN");
        builder.environment().putAll(env);
        return builder;
    }

    /** This run, if it exited with 0; otherwise an error that carries its stderr. */
    public CommandRun succeeded() {
        if (exitCode != 0) {
            throw new AssertionError("pressmark exited with " + exitCode + ":\n" + err);
        }
        return this;
    }

    private static CompletableFuture<byte[]> drain(InputStream stream) {
        return CompletableFuture.supplyAsync(() -> {
            try (stream; ByteArrayOutputStream buffer = new ByteArrayOutputStream()) {
                stream.transferTo(buffer);
                return buffer.toByteArray();
            } catch (IOException e) {
                throw new UncheckedIOException(e);
            }
        });
    }
}
