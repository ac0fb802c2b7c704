package dev.pressmark.cli;

import dev.pressmark.core.PressmarkException;
import dev.pressmark.server.ServerConfig;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.concurrent.Callable;
import java.util.concurrent.CountDownLatch;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;

/** {@code pressmark demo}: the whole job on invented listings, in a temporary store, then serve it. */
@Command(name = "demo", mixinStandardHelpOptions = true, description = {
    // each entry is one paragraph, and the first is the summary the command list shows: whole sentences
    "Run the whole job on invented listing titles: train two versions, publish them into a store of their own and serve one.",
    "It trains a whole-word version (v1) and a WordPiece version (v2), activates v2 and serves it with a one-off admin token.",
    "Ctrl-C stops the server and removes the temporary store (unless --keep)."})
final class DemoCommand implements Callable<Integer> {

    @Option(names = "--port", paramLabel = "PORT", defaultValue = "" + ServerConfig.DEFAULT_PORT,
            description = "The TCP port on 127.0.0.1 (default: ${DEFAULT-VALUE}; 0 picks a free one).")
    int port;

    @Option(names = "--keep", paramLabel = "DIR",
            description = "Build the store in DIR and keep it afterwards (default: a temporary directory, removed on exit).")
    Path keep;

    @Override
    public Integer call() throws InterruptedException {
        Path dir = keep != null ? created(keep) : temporary();
        Demo demo = Demo.start(dir, keep == null, port, new ConsoleProgress(System.err), System.err);
        CountDownLatch stopped = new CountDownLatch(1);
        Runtime.getRuntime().addShutdownHook(new Thread(() -> {
            demo.close();
            System.err.println(keep == null ? "pressmark demo: stopped; removed " + dir : "pressmark demo: stopped; the store stays in " + dir);
            stopped.countDown();
        }, "pressmark-demo-shutdown"));
        System.out.println("pressmark demo: serving " + Demo.MODEL + " " + Demo.SUBWORDS_TAG + " (store in " + dir + ")");
        demo.instructions().forEach(System.out::println);
        System.out.println("Ctrl-C stops the demo" + (keep == null ? " and removes its store." : "."));
        System.out.flush();
        stopped.await();
        return Main.EXIT_OK;
    }

    private static Path created(Path dir) {
        try {
            return Files.createDirectories(dir).toAbsolutePath();
        } catch (IOException e) {
            throw new PressmarkException("file-unwritable", dir + ": cannot create the directory: " + e.getMessage(), e);
        }
    }

    private static Path temporary() {
        try {
            return Files.createTempDirectory("pressmark-demo-");
        } catch (IOException e) {
            throw new UncheckedIOException("cannot create a temporary directory", e);
        }
    }
}
