package dev.pressmark.core.bundle;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.IOException;
import java.util.ArrayList;
import java.util.List;

/**
 * The bundle's {@code tokenizer.json}: one {@link TokenizerSpec} object when the model has one view
 * of its text (as in format 1), or {@code {"views": [spec, ...]}} when it has several.
 */
final class TokenizerViews {

    static final String VIEWS = "views";

    private static final ObjectMapper JSON = new ObjectMapper();

    private TokenizerViews() {
    }

    static JsonNode toJson(List<TokenizerSpec> views) {
        if (views.size() == 1) {
            return JSON.valueToTree(views.get(0));
        }
        ObjectNode root = JSON.createObjectNode();
        ArrayNode list = root.putArray(VIEWS);
        views.forEach(view -> list.add(JSON.<JsonNode>valueToTree(view)));
        return root;
    }

    static List<TokenizerSpec> read(byte[] json) throws IOException {
        JsonNode root = JSON.readTree(json);
        if (root == null || !root.isObject()) {
            throw new IllegalArgumentException("tokenizer.json must hold an object");
        }
        if (!root.has(VIEWS)) {
            return List.of(JSON.treeToValue(root, TokenizerSpec.class));
        }
        JsonNode list = root.get(VIEWS);
        if (!list.isArray() || list.size() < 2 || root.size() != 1) {
            throw new IllegalArgumentException("tokenizer.json's views must be a list of at least two views and its"
                    + " only key");
        }
        List<TokenizerSpec> views = new ArrayList<>(list.size());
        for (JsonNode view : list) {
            views.add(JSON.treeToValue(view, TokenizerSpec.class));
        }
        return views;
    }
}
