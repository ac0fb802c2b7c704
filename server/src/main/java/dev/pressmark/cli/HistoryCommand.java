package dev.pressmark.cli;

import dev.pressmark.store.Activation;
import dev.pressmark.store.BundleStore;
import dev.pressmark.store.StoreEvent;
import java.util.List;
import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Parameters;

/** {@code pressmark history}: a model's activations and audit events, newest first. */
@Command(name = "history", mixinStandardHelpOptions = true, description = "Show a model's activations and audit events, newest first.")
final class HistoryCommand implements Callable<Integer> {

    @Parameters(index = "0", paramLabel = "NAME", description = "The model name.")
    String name;

    @Mixin
    StoreOption store;

    @Override
    public Integer call() {
        List<Activation> activations;
        List<StoreEvent> events;
        try (BundleStore opened = store.open()) {
            activations = opened.activations(name);
            events = opened.events(name);
        }
        System.out.println("activations of " + name + ", newest first (the first is active):");
        for (Activation a : activations) {
            System.out.printf("  #%-6d %s  %-12s %-9s by %s%s%n", a.sequence(), a.activatedAt(), a.tag(), a.rollback() ? "rollback" : "activate",
                    a.actor(), a.reason().isEmpty() ? "" : "  " + a.reason());
        }
        System.out.println("events of " + name + ", newest first:");
        for (StoreEvent e : events) {
            System.out.printf("  %s  %-8s %-12s by %s%s%n", e.at(), e.action(), e.tag(), e.actor(), e.detail().isEmpty() ? "" : "  " + e.detail());
        }
        return Main.EXIT_OK;
    }
}
