package dev.pressmark.core.contract;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.util.Objects;
import java.util.Optional;

/**
 * What the store records about a version's contract when it is published: its contract version,
 * and the difference from the version that was active then ({@code against}, empty for the first).
 * Kept as {@code {"version":"2.0.0","against":"1.4","diff":{...}}}.
 */
public record ContractRecord(SemanticVersion version, Optional<String> against, ContractDiff diff) {

    private static final ObjectMapper JSON = new ObjectMapper();

    public ContractRecord {
        Objects.requireNonNull(version, "version");
        Objects.requireNonNull(against, "against");
        Objects.requireNonNull(diff, "diff");
    }

    /** The record of a model's first version, or of one published while no version is active. */
    public static ContractRecord first() {
        return new ContractRecord(SemanticVersion.FIRST, Optional.empty(), ContractDiff.NONE);
    }

    /** The record of {@code contract} published against the active version {@code activeTag} whose contract and record are given. */
    public static ContractRecord against(String activeTag, Contract active, SemanticVersion activeVersion, Contract contract) {
        ContractDiff diff = ContractDiff.between(active, contract);
        return new ContractRecord(diff.next(activeVersion), Optional.of(activeTag), diff);
    }

    public ObjectNode toJsonNode() {
        ObjectNode node = JSON.createObjectNode();
        node.put("version", version.toString());
        if (against.isPresent()) {
            node.put("against", against.get());
        } else {
            node.putNull("against");
        }
        node.set("diff", diff.toJson());
        return node;
    }

    public String toJson() {
        return toJsonNode().toString();
    }

    public static ContractRecord parse(String json) {
        try {
            JsonNode node = JSON.readTree(json);
            JsonNode against = node.path("against");
            return new ContractRecord(SemanticVersion.parse(node.path("version").asText()),
                    against.isTextual() ? Optional.of(against.textValue()) : Optional.empty(), ContractDiff.fromJson(node.path("diff")));
        } catch (JsonProcessingException e) {
            throw new IllegalArgumentException("a contract record must be JSON: " + e.getOriginalMessage(), e);
        }
    }
}
