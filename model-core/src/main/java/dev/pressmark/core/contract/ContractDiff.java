package dev.pressmark.core.contract;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.node.JsonNodeFactory;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.util.ArrayList;
import java.util.List;
import java.util.SortedSet;
import java.util.TreeSet;

/**
 * How a new version's contract differs from the one served. Removing an input field or a label
 * breaks clients (they send a field the model ignores, or act on a label that no longer comes).
 * Adding an input field breaks them too, because predict requires every input field of the model
 * in every item (the server answers 400 for a missing one). Adding a label does not: clients
 * that only know the old labels still parse every answer.
 */
public record ContractDiff(List<String> addedFields, List<String> removedFields, List<String> addedLabels, List<String> removedLabels) {

    /** No difference. */
    public static final ContractDiff NONE = new ContractDiff(List.of(), List.of(), List.of(), List.of());

    public ContractDiff {
        addedFields = List.copyOf(addedFields);
        removedFields = List.copyOf(removedFields);
        addedLabels = List.copyOf(addedLabels);
        removedLabels = List.copyOf(removedLabels);
    }

    public static ContractDiff between(Contract before, Contract after) {
        return new ContractDiff(minus(after.inputFields(), before.inputFields()), minus(before.inputFields(), after.inputFields()),
                minus(after.labels(), before.labels()), minus(before.labels(), after.labels()));
    }

    private static List<String> minus(SortedSet<String> a, SortedSet<String> b) {
        SortedSet<String> rest = new TreeSet<>(a);
        rest.removeAll(b);
        return new ArrayList<>(rest);
    }

    public boolean isEmpty() {
        return addedFields.isEmpty() && removedFields.isEmpty() && addedLabels.isEmpty() && removedLabels.isEmpty();
    }

    /** Whether clients of the old contract can break: a field or label removed, or a (required) field added. */
    public boolean breaking() {
        return !removedFields.isEmpty() || !removedLabels.isEmpty() || !addedFields.isEmpty();
    }

    /** The contract version after this change to a contract at {@code before}: major up if breaking, minor up if any change. */
    public SemanticVersion next(SemanticVersion before) {
        if (breaking()) {
            return before.nextMajor();
        }
        return isEmpty() ? before : before.nextMinor();
    }

    /** One line for people: what changed and whether it breaks, e.g. "removed labels [spam]; added fields [body] (required by predict)". */
    public String describe() {
        List<String> parts = new ArrayList<>();
        if (!removedFields.isEmpty()) {
            parts.add("removed fields " + removedFields);
        }
        if (!addedFields.isEmpty()) {
            parts.add("added fields " + addedFields + " (breaking: predict requires every input field)");
        }
        if (!removedLabels.isEmpty()) {
            parts.add("removed labels " + removedLabels);
        }
        if (!addedLabels.isEmpty()) {
            parts.add("added labels " + addedLabels);
        }
        return parts.isEmpty() ? "no change" : String.join("; ", parts);
    }

    public ObjectNode toJson() {
        ObjectNode node = JsonNodeFactory.instance.objectNode();
        node.set("added_fields", array(addedFields));
        node.set("removed_fields", array(removedFields));
        node.set("added_labels", array(addedLabels));
        node.set("removed_labels", array(removedLabels));
        node.put("breaking", breaking());
        return node;
    }

    static ContractDiff fromJson(JsonNode node) {
        return new ContractDiff(list(node.path("added_fields")), list(node.path("removed_fields")), list(node.path("added_labels")),
                list(node.path("removed_labels")));
    }

    private static JsonNode array(List<String> values) {
        var array = JsonNodeFactory.instance.arrayNode();
        values.forEach(array::add);
        return array;
    }

    private static List<String> list(JsonNode array) {
        List<String> values = new ArrayList<>();
        array.forEach(n -> values.add(n.asText()));
        return values;
    }
}
