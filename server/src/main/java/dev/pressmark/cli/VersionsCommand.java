package dev.pressmark.cli;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.NullNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import dev.pressmark.core.contract.ContractRecord;
import dev.pressmark.server.Views;
import dev.pressmark.store.BundleStore;
import dev.pressmark.store.Version;
import java.util.List;
import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

/** {@code pressmark versions}: a model's versions, newest first, the active one marked. */
@Command(name = "versions", mixinStandardHelpOptions = true, description = "List a model's versions, newest first; * marks the active one.")
final class VersionsCommand implements Callable<Integer> {

    @Parameters(index = "0", paramLabel = "NAME", description = "The model name.")
    String name;

    @Option(names = "--json", description = "Print {\"model\": NAME, \"versions\": [...]} instead of a table.")
    boolean json;

    @Mixin
    StoreOption store;

    @Override
    public Integer call() throws Exception {
        List<Version> versions;
        try (BundleStore opened = store.open()) {
            versions = opened.versions(name);
        }
        if (json) {
            ObjectMapper mapper = new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT);
            ObjectNode root = mapper.createObjectNode();
            root.put("model", name);
            ArrayNode list = root.putArray("versions");
            for (Version v : versions) {
                Views.putSummary(list.addObject(), v)
                        .put("signed", v.signatureJson().isPresent())
                        .set("contract", v.contract().<JsonNode>map(ContractRecord::toJsonNode).orElse(NullNode.getInstance()));
            }
            System.out.println(mapper.writeValueAsString(root));
            return Main.EXIT_OK;
        }
        int width = 3;
        for (Version v : versions) {
            width = Math.max(width, v.tag().length());
        }
        System.out.printf("  %-" + width + "s  %-24s  %12s  %-8s  %s%n", "TAG", "CREATED", "BYTES", "CONTRACT", "SHA-256");
        for (Version v : versions) {
            System.out.printf("%s %-" + width + "s  %-24s  %12d  %-8s  %s%s%s%n", v.active() ? "*" : " ", v.tag(), v.createdAt(), v.sizeBytes(),
                    v.contract().map(c -> c.version().toString()).orElse("-"), v.sha256(), v.signatureJson().isPresent() ? "  signed" : "",
                    v.retired() ? "  retired" : "");
        }
        return Main.EXIT_OK;
    }
}
