package dev.pressmark.cli;

import dev.pressmark.store.BundleStore;
import dev.pressmark.store.TrustedKey;
import java.nio.file.Path;
import java.util.List;
import java.util.concurrent.Callable;
import picocli.CommandLine.ArgGroup;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;

/** {@code pressmark trust}: the public keys whose signatures the store accepts. */
@Command(name = "trust", mixinStandardHelpOptions = true,
        description = {"Add, list or remove the public keys whose signatures the store accepts.",
            "While it trusts any key, the store refuses to publish or serve a bundle that is not signed by one of them."})
final class TrustCommand implements Callable<Integer> {

    static final class Action {
        @Option(names = "--key", paramLabel = "FILE", description = "Trust the public key in FILE (as `pressmark keygen` writes FILE.pub).")
        Path key;

        @Option(names = "--list", description = "List the trusted keys.")
        boolean list;

        @Option(names = "--remove", paramLabel = "KEY_ID", description = "Stop trusting the key with this id.")
        String remove;
    }

    @ArgGroup(exclusive = true, multiplicity = "1")
    Action action;

    @Mixin
    StoreOption store;

    @Override
    public Integer call() {
        try (BundleStore opened = store.open()) {
            if (action.key != null) {
                TrustedKey key = opened.trust(InputFiles.readText(action.key), StoreOption.actor());
                System.out.printf("trusting key %s from %s%n", key.keyId(), action.key);
            } else if (action.remove != null) {
                opened.distrust(action.remove, StoreOption.actor());
                int left = opened.trustedKeys().size();
                System.out.printf("no longer trusting key %s; %d trusted key(s) left%s%n", action.remove, left,
                        left == 0 ? ", so unsigned bundles are accepted again" : "");
            } else {
                list(opened.trustedKeys());
            }
        }
        return Main.EXIT_OK;
    }

    private static void list(List<TrustedKey> keys) {
        if (keys.isEmpty()) {
            System.out.println("no trusted keys: the store accepts unsigned bundles");
            return;
        }
        System.out.printf("%-16s  %-24s  %s%n", "KEY_ID", "ADDED", "BY");
        for (TrustedKey key : keys) {
            System.out.printf("%-16s  %-24s  %s%n", key.keyId(), key.addedAt(), key.actor());
        }
    }
}
