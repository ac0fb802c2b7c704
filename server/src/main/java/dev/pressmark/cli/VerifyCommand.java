package dev.pressmark.cli;

import dev.pressmark.store.BundleStore;
import dev.pressmark.store.VerifyReport;
import java.util.Optional;
import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Parameters;

/** {@code pressmark verify}: recompute every stored checksum; exit 1 when any differs. */
@Command(name = "verify", mixinStandardHelpOptions = true,
        description = {"Recompute the SHA-256 of every stored version (or of one model's), load each as a model, and list each mismatch"
            + " and each version that does not load.",
            "Exits 1 when anything does not match or does not load."})
final class VerifyCommand implements Callable<Integer> {

    @Parameters(index = "0", arity = "0..1", paramLabel = "NAME", description = "Only this model.")
    String name;

    @Mixin
    StoreOption store;

    @Override
    public Integer call() {
        VerifyReport report;
        try (BundleStore opened = store.open()) {
            report = opened.verify(Optional.ofNullable(name));
        }
        for (VerifyReport.Mismatch mismatch : report.mismatches()) {
            System.out.println("MISMATCH " + mismatch.describe());
        }
        for (VerifyReport.Unusable unusable : report.unusable()) {
            System.out.println("UNUSABLE " + unusable.describe());
        }
        if (report.ok()) {
            System.out.printf("verified %d version%s: every checksum matches and every version loads%n", report.checked(),
                    report.checked() == 1 ? "" : "s");
            return Main.EXIT_OK;
        }
        if (!report.mismatches().isEmpty()) {
            System.err.printf("pressmark: %d of %d versions do not match their recorded SHA-256%n", report.mismatches().size(), report.checked());
        }
        if (!report.unusable().isEmpty()) {
            System.err.printf("pressmark: %d of %d versions do not load as a model%n", report.unusable().size(), report.checked());
        }
        return Main.EXIT_FAILURE;
    }
}
