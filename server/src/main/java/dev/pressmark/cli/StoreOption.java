package dev.pressmark.cli;

import dev.pressmark.store.BundleStore;
import dev.pressmark.store.jdbc.JdbcStores;
import picocli.CommandLine.Option;

/** The {@code --store URL} option that every store command shares, and the actor it records. */
final class StoreOption {

    @Option(names = "--store", paramLabel = "URL", defaultValue = "${env:" + BundleStore.URL_ENV + ":-" + BundleStore.DEFAULT_URL + "}",
            description = {"The store: sqlite:PATH or jdbc:postgresql://HOST[:PORT]/DATABASE",
                "(default: env PRESSMARK_STORE, else " + BundleStore.DEFAULT_URL + "; created on first use)."})
    String url;

    BundleStore open() {
        return JdbcStores.open(url);
    }

    /** Who the audit events name: the user running the command. */
    static String actor() {
        String user = System.getProperty("user.name");
        return user == null || user.isBlank() ? "unknown" : user;
    }
}
