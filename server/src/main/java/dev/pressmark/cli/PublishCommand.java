package dev.pressmark.cli;

import dev.pressmark.core.contract.ContractDiff;
import dev.pressmark.core.contract.ContractRecord;
import dev.pressmark.store.BundleStore;
import dev.pressmark.store.PublishOptions;
import dev.pressmark.store.StoreException;
import dev.pressmark.store.Version;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Optional;
import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

/** {@code pressmark publish}: put a bundle into the store under an immutable tag. */
@Command(name = "publish", mixinStandardHelpOptions = true,
        description = "Check a bundle's checksums, that it loads within the limits, its signature and contract, and store it under NAME and"
                + " an immutable TAG.")
final class PublishCommand implements Callable<Integer> {

    @Parameters(index = "0", paramLabel = "BUNDLE", description = "The bundle file (.pmb).")
    Path bundle;

    @Option(names = "--name", required = true, paramLabel = "NAME", description = "The model name, [a-z0-9][a-z0-9-]{0,63}.")
    String name;

    @Option(names = "--tag", required = true, paramLabel = "TAG", description = "The version tag, [A-Za-z0-9][A-Za-z0-9._-]{0,63}.")
    String tag;

    @Option(names = "--activate", description = "Make the new version the active one.")
    boolean activate;

    @Option(names = "--signature", paramLabel = "FILE", description = "The bundle's signature file (default: BUNDLE.sig when it exists).")
    Path signature;

    @Option(names = "--allow-breaking", description = "Publish even if the bundle breaks the active version's contract (removes an input field or a label,"
            + " or adds a field); its contract version then raises the major.")
    boolean allowBreaking;

    @Mixin
    StoreOption store;

    @Override
    public Integer call() {
        Optional<Path> signatureFile = signatureFile();
        Optional<String> signatureJson = signatureFile.map(InputFiles::readText);
        try (BundleStore opened = store.open()) {
            Version version;
            try {
                // streamed from the file: a device or a file past the size limit is refused before it is read
                version = opened.publish(name, tag, bundle, new PublishOptions(signatureJson, allowBreaking), StoreOption.actor());
            } catch (StoreException e) {
                throw switch (e.code()) {
                    case StoreException.NOT_A_BUNDLE, StoreException.UNUSABLE, StoreException.LIMIT -> e.getMessage().startsWith(bundle + ": ")
                            ? e : new StoreException(e.code(), bundle + ": " + e.getMessage(), e);
                    case StoreException.BREAKING -> new StoreException(e.code(), e.getMessage() + " (pass --allow-breaking)", e);
                    case StoreException.BAD_SIGNATURE -> new StoreException(e.code(), e.getMessage()
                            + signatureFile.map(f -> " (signature file " + f + ")").orElse(""), e);
                    default -> e;
                };
            }
            System.out.printf("published %s %s (sha256 %s, %,d bytes)%s%n", version.model(), version.tag(), version.sha256(), version.sizeBytes(),
                    signatureFile.map(f -> ", signature " + f).orElse(""));
            version.contract().ifPresent(PublishCommand::printContract);
            if (activate) {
                opened.activate(name, tag, StoreOption.actor(), "published with --activate");
                System.out.printf("activated %s %s%n", name, tag);
            }
        }
        return Main.EXIT_OK;
    }

    private Optional<Path> signatureFile() {
        if (signature != null) {
            return Optional.of(signature);
        }
        Path beside = SignCommand.signatureFile(bundle);
        return Files.isRegularFile(beside) ? Optional.of(beside) : Optional.empty();
    }

    private static void printContract(ContractRecord contract) {
        if (contract.against().isEmpty()) {
            System.out.printf("contract %s (no active version to compare with)%n", contract.version());
            return;
        }
        ContractDiff diff = contract.diff();
        System.out.printf("contract %s against active %s: %s%s%n", contract.version(), contract.against().get(), diff.describe(),
                diff.breaking() ? " (breaking, allowed)" : "");
        printList("  added fields:   ", diff.addedFields());
        printList("  removed fields: ", diff.removedFields());
        printList("  added labels:   ", diff.addedLabels());
        printList("  removed labels: ", diff.removedLabels());
    }

    private static void printList(String heading, List<String> values) {
        if (!values.isEmpty()) {
            System.out.println(heading + String.join(", ", values));
        }
    }
}
