package dev.pressmark.cli;

import dev.pressmark.store.BundleStore;
import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

/** {@code pressmark activate}: make a version the one served. */
@Command(name = "activate", mixinStandardHelpOptions = true, description = "Make TAG the active version of model NAME.")
final class ActivateCommand implements Callable<Integer> {

    @Parameters(index = "0", paramLabel = "NAME", description = "The model name.")
    String name;

    @Parameters(index = "1", paramLabel = "TAG", description = "The version tag.")
    String tag;

    @Option(names = "--reason", paramLabel = "TEXT", defaultValue = "", description = "Why, for the history.")
    String reason;

    @Mixin
    StoreOption store;

    @Override
    public Integer call() {
        try (BundleStore opened = store.open()) {
            opened.activate(name, tag, StoreOption.actor(), reason);
        }
        System.out.printf("activated %s %s%n", name, tag);
        return Main.EXIT_OK;
    }
}
