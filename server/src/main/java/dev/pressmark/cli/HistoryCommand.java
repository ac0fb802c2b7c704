package dev.pressmark.cli;

import dev.pressmark.store.Activation;
import dev.pressmark.store.BundleStore;
import dev.pressmark.store.StoreEvent;
import java.time.Instant;
import java.time.ZoneOffset;
import java.time.format.DateTimeFormatter;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Parameters;

/** {@code pressmark history}: a model's activations and audit events, newest first. */
@Command(name = "history", mixinStandardHelpOptions = true, description = "Show a model's activations and audit events, newest first.")
final class HistoryCommand implements Callable<Integer> {

    /** Always three digits of milliseconds: {@link Instant#toString()} drops them on a whole second, which shifts the row. */
    private static final DateTimeFormatter TIME = DateTimeFormatter.ofPattern("uuuu-MM-dd'T'HH:mm:ss.SSS'Z'").withZone(ZoneOffset.UTC);

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
        System.out.print(render(name, activations, events));
        return Main.EXIT_OK;
    }

    /** Both tables, each with its columns as wide as their widest value, so that every row of a table lines up. */
    static String render(String name, List<Activation> activations, List<StoreEvent> events) {
        List<String[]> activationRows = new ArrayList<>();
        for (Activation a : activations) {
            activationRows.add(new String[] {"#" + a.sequence(), TIME.format(a.activatedAt()), a.tag(), a.rollback() ? "rollback" : "activate",
                "by " + a.actor(), a.reason()});
        }
        List<String[]> eventRows = new ArrayList<>();
        for (StoreEvent e : events) {
            eventRows.add(new String[] {TIME.format(e.at()), e.action(), e.tag(), "by " + e.actor(), e.detail()});
        }
        return "activations of " + name + ", newest first (the first is active):\n" + aligned(activationRows)
                + "events of " + name + ", newest first:\n" + aligned(eventRows);
    }

    /** Each row indented by two spaces, its cells two spaces apart and padded to their column's widest cell. */
    private static String aligned(List<String[]> rows) {
        int columns = rows.isEmpty() ? 0 : rows.get(0).length;
        int[] widths = new int[columns];
        for (String[] row : rows) {
            for (int i = 0; i < columns; i++) {
                widths[i] = Math.max(widths[i], row[i].length());
            }
        }
        StringBuilder out = new StringBuilder();
        for (String[] row : rows) {
            StringBuilder line = new StringBuilder(" ");
            for (int i = 0; i < columns; i++) {
                line.append(' ').append(row[i]).append(" ".repeat(widths[i] - row[i].length() + 1));
            }
            out.append(line.toString().stripTrailing()).append('\n');
        }
        return out.toString();
    }
}
