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

/** Runs {@code pressmark} in a child JVM, as a user would, and collects its output and exit code. */
record CommandRun(int exitCode, String out, String err) {

    private static final long TIMEOUT_SECONDS = 120;

    static CommandRun of(Path workDir, String input, String... args) {
        return of(workDir, input.getBytes(StandardCharsets.UTF_8), args);
    }

    static CommandRun of(Path workDir, byte[] input, String... args) {
        return of(workDir, Map.of(), input, args);
    }

    /**
     * With {@code env} added to the child's environment. The child never inherits this JVM's
     * {@code PRESSMARK_STORE} or {@code PRESSMARK_ADMIN_TOKEN}: a developer's own settings must not
     * reach a test.
     */
    static CommandRun of(Path workDir, Map<String, String> env, byte[] input, String... args) {
        List<String> command = new ArrayList<>();
        command.add(Path.of(System.getProperty("java.home"), "bin", "java").toString());
        command.add("-cp");
        command.add(System.getProperty("java.class.path"));
        command.add(Main.class.getName());
        command.addAll(List.of(args));
        try {
            ProcessBuilder builder = new ProcessBuilder(command).directory(workDir.toFile());
            builder.environment().remove("PRESSMARK_STORE");
            builder.environment().remove("PRESSMARK_ADMIN_TOKEN");
            builder.environment().putAll(env);
            Process process = builder.start();
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
