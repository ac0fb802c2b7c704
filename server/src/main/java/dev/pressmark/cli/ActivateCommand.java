package dev.pressmark.cli;

import dev.pressmark.core.PressmarkException;
import dev.pressmark.store.BundleStore;
import dev.pressmark.store.Promotion;
import dev.pressmark.store.PromotionPolicy;
import dev.pressmark.store.ShadowReport;
import java.util.Optional;
import java.util.concurrent.Callable;
import picocli.CommandLine;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/**
 * {@code pressmark activate}: make a version the one served, after the promotion check against
 * the active version, through the one activation rule ({@link Promotion}); {@code --force --reason}
 * overrides a refusal and records both in the events.
 */
@Command(name = "activate", mixinStandardHelpOptions = true, description = {"Make TAG the active version of model NAME.",
    "Refused when TAG's recorded metric is lower than the active version's by more than the margin, or its shadow agreed too rarely,"
        + " unless --force is given with --reason."})
final class ActivateCommand implements Callable<Integer> {

    @Parameters(index = "0", paramLabel = "NAME", description = "The model name.")
    String name;

    @Parameters(index = "1", paramLabel = "TAG", description = "The version tag.")
    String tag;

    @Option(names = "--reason", paramLabel = "TEXT", defaultValue = "", description = "Why, for the history; required with --force.")
    String reason;

    @Option(names = "--force", description = "Activate even when the promotion check refuses; needs --reason.")
    boolean force;

    @Option(names = "--metric", paramLabel = "KEY", defaultValue = PromotionPolicy.DEFAULT_METRIC,
            description = "The manifest metric compared, test split first, else the cross-validation mean (default: ${DEFAULT-VALUE}).")
    String metric;

    @Option(names = "--max-drop", paramLabel = "X", defaultValue = "" + PromotionPolicy.DEFAULT_MAX_DROP,
            description = "Refuse when TAG's metric is lower than the active version's by more than X (default: ${DEFAULT-VALUE}).")
    double maxDrop;

    @Option(names = "--min-agreement", paramLabel = "A", defaultValue = "" + PromotionPolicy.DEFAULT_MIN_AGREEMENT,
            description = "Refuse when TAG's shadow report of at least --min-samples items agreed with the active version less often"
                    + " (default: ${DEFAULT-VALUE}, off).")
    double minAgreement;

    @Option(names = "--min-samples", paramLabel = "N", defaultValue = "" + PromotionPolicy.DEFAULT_MIN_SAMPLES,
            description = "Items a shadow report needs before its agreement counts (default: ${DEFAULT-VALUE}).")
    long minSamples;

    @Mixin
    StoreOption store;

    @Spec
    CommandSpec spec;

    @Override
    public Integer call() {
        if (force && reason.isBlank()) {
            throw new CommandLine.ParameterException(spec.commandLine(), "--force needs --reason TEXT: the reason goes into the events");
        }
        PromotionPolicy policy = new PromotionPolicy(metric, maxDrop, minAgreement, minSamples);
        try (BundleStore opened = store.open()) {
            Promotion.Result result;
            try {
                result = Promotion.activate(opened, new Promotion.Request(name, tag, force, reason, policy, StoreOption.actor()),
                        ShadowReport.merged(opened.shadowReports(name, Optional.of(tag))));
            } catch (Promotion.Refused e) {
                throw new PressmarkException(e.code(), e.getMessage() + " (--force --reason TEXT activates anyway)", e);
            }
            if (result.forced()) {
                System.out.printf("forced past the promotion check: %s%n", result.outcome().describe());
            }
        }
        System.out.printf("activated %s %s%n", name, tag);
        return Main.EXIT_OK;
    }
}
