package dev.pressmark.cli;

import dev.pressmark.store.Activation;
import dev.pressmark.store.BundleStore;
import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Parameters;

/** {@code pressmark rollback}: re-activate the version that was active before the current one. */
@Command(name = "rollback", mixinStandardHelpOptions = true,
        description = "Re-activate the version that was active before the current one; again to go further back.")
final class RollbackCommand implements Callable<Integer> {

    @Parameters(index = "0", paramLabel = "NAME", description = "The model name.")
    String name;

    @Mixin
    StoreOption store;

    @Override
    public Integer call() {
        Activation activation;
        try (BundleStore opened = store.open()) {
            activation = opened.rollback(name, StoreOption.actor());
        }
        System.out.printf("rolled back %s to %s%n", name, activation.tag());
        return Main.EXIT_OK;
    }
}
