package dev.pressmark.cli;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import dev.pressmark.core.PressmarkException;
import dev.pressmark.server.Views;
import dev.pressmark.store.BundleStore;
import dev.pressmark.store.ShadowSummary;
import dev.pressmark.store.lifecycle.ShadowStatus;
import java.util.Map;
import java.util.Optional;
import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

/** {@code pressmark shadow-report}: the newest shadow run of a model, every replica's report summed. */
@Command(name = "shadow-report", mixinStandardHelpOptions = true, description = {
    "Show the newest shadow run of NAME as the servers last wrote it to the store (every few seconds), all replicas summed."})
final class ShadowReportCommand implements Callable<Integer> {

    @Parameters(index = "0", paramLabel = "NAME", description = "The model name.")
    String name;

    @Option(names = "--json", description = "Print the report as the service's GET /models/NAME/shadow does.")
    boolean json;

    @Mixin
    StoreOption store;

    @Override
    public Integer call() throws Exception {
        ShadowStatus status;
        try (BundleStore opened = store.open()) {
            opened.versions(name);
            String active = opened.activeVersion(name).map(v -> v.tag()).orElse("");
            status = ShadowStatus.of(name, opened.shadow(name), opened.shadowReports(name, Optional.empty()), active)
                    .orElseThrow(() -> new PressmarkException("no-shadow", name + " has no shadow running and no shadow report"));
        }
        if (json) {
            System.out.println(new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT).writeValueAsString(Views.shadowStatus(status)));
            return Main.EXIT_OK;
        }
        ShadowSummary s = status.summary();
        System.out.printf("shadow of %s %s against %s, %s, started %s, %d replica(s)%n", name, status.candidate(), s.active(),
                status.running().map(r -> "running on a fraction " + r.fraction()).orElse("stopped"), status.startedAt(), status.replicas());
        System.out.printf("  items scored %d, dropped %d, agreement %s%n", s.samples(), s.dropped(),
                s.samples() == 0 ? "-" : String.format("%.4f (%d of %d)", s.agreement(), s.agreeing(), s.samples()));
        System.out.printf("  %s difference (candidate - active): mean %s, |p50| <= %s, |p90| <= %s, |p99| <= %s, max |d| %s%n", s.basis(),
                format(s.meanDifference()), format(s.absDifferenceQuantile(0.5)), format(s.absDifferenceQuantile(0.9)),
                format(s.absDifferenceQuantile(0.99)), format(s.maxAbsDifference()));
        System.out.println("  labels (active -> candidate: items):");
        for (Map.Entry<String, ? extends Map<String, Long>> row : s.labels().entrySet()) {
            for (Map.Entry<String, Long> cell : row.getValue().entrySet()) {
                System.out.printf("    %s -> %s: %d%n", row.getKey(), cell.getKey(), cell.getValue());
            }
        }
        return Main.EXIT_OK;
    }

    private static String format(double value) {
        return Double.isNaN(value) ? "-" : String.format("%.4f", value);
    }
}
