package dev.pressmark.cli;

import dev.pressmark.store.BundleStore;
import dev.pressmark.store.Version;
import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

/** {@code pressmark retire}: mark a version retired, with a reason, through the store's one rule for it. */
@Command(name = "retire", mixinStandardHelpOptions = true, description = {
    "Retire version TAG of model NAME: it stays listed and readable but can no longer be activated, rolled back to or shadowed.",
    "The reason goes into the history. The active version and a version retired already are refused."})
final class RetireCommand implements Callable<Integer> {

    @Parameters(index = "0", paramLabel = "NAME", description = "The model name.")
    String name;

    @Parameters(index = "1", paramLabel = "TAG", description = "The version tag.")
    String tag;

    @Option(names = "--reason", required = true, paramLabel = "TEXT", description = "Why, for the history (required).")
    String reason;

    @Mixin
    StoreOption store;

    @Override
    public Integer call() {
        Version retired;
        try (BundleStore opened = store.open()) {
            retired = opened.retire(name, tag, StoreOption.actor(), reason);
        }
        System.out.printf("retired %s %s%n", retired.model(), retired.tag());
        return Main.EXIT_OK;
    }
}
