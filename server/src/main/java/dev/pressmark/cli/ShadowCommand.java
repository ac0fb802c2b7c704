package dev.pressmark.cli;

import dev.pressmark.store.BundleStore;
import dev.pressmark.store.Shadow;
import java.util.Optional;
import java.util.concurrent.Callable;
import picocli.CommandLine;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** {@code pressmark shadow}: start or stop scoring a candidate beside the active version on live traffic. */
@Command(name = "shadow", mixinStandardHelpOptions = true, description = {
    "Score TAG beside NAME's active version on a fraction of live requests, on every server of the store (within about 2 s).",
    "The answers stay the active version's; a new activation, a rollback or --stop ends the run. See shadow-report."})
final class ShadowCommand implements Callable<Integer> {

    @Parameters(index = "0", paramLabel = "NAME", description = "The model name.")
    String name;

    @Parameters(index = "1", paramLabel = "TAG", arity = "0..1", description = "The candidate version (not the active one).")
    String tag;

    @Option(names = "--fraction", paramLabel = "F", defaultValue = "" + Shadow.DEFAULT_FRACTION,
            description = "The share of requests scored, in (0, 1] (default: ${DEFAULT-VALUE}).")
    double fraction;

    @Option(names = "--stop", description = "Stop the model's shadow; its reports stay.")
    boolean stop;

    @Mixin
    StoreOption store;

    @Spec
    CommandSpec spec;

    @Override
    public Integer call() {
        if (stop == (tag != null)) {
            throw new CommandLine.ParameterException(spec.commandLine(), stop ? "--stop takes no TAG" : "give a TAG to shadow, or --stop");
        }
        try (BundleStore opened = store.open()) {
            if (stop) {
                Optional<Shadow> stopped = opened.stopShadow(name, StoreOption.actor(), "stopped from the command line");
                System.out.println(stopped.map(s -> "stopped the shadow of " + name + " " + s.tag()).orElse(name + " had no shadow running"));
                return Main.EXIT_OK;
            }
            Shadow started = opened.startShadow(name, tag, fraction, StoreOption.actor());
            String active = opened.activeVersion(name).map(v -> v.tag()).orElse("?");
            System.out.printf("shadowing %s %s against the active %s on a fraction %s of requests%n", name, started.tag(), active, started.fraction());
        }
        return Main.EXIT_OK;
    }
}
