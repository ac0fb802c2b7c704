package dev.pressmark.core.search;

import com.fasterxml.jackson.core.JsonParser;
import com.fasterxml.jackson.core.JsonStreamContext;
import com.fasterxml.jackson.core.JsonToken;
import com.fasterxml.jackson.dataformat.yaml.YAMLFactory;
import java.io.IOException;
import java.util.ArrayList;
import java.util.Collections;
import java.util.HashMap;
import java.util.List;
import java.util.Map;

/**
 * The line of every mapping key of a YAML text, by its path ({@code [search, grid, classifier.c]}:
 * a key may itself hold dots; a list entry is its index), for messages that point at the line a
 * person wrote.
 */
public final class YamlLines {

    private static final YAMLFactory YAML = new YAMLFactory();

    private final Map<List<String>, Integer> lines;

    private YamlLines(Map<List<String>, Integer> lines) {
        this.lines = lines;
    }

    /** The key lines of {@code yaml}; text that does not parse has those before the fault. */
    public static YamlLines of(String yaml) {
        Map<List<String>, Integer> lines = new HashMap<>();
        try (JsonParser parser = YAML.createParser(yaml)) {
            for (JsonToken token = parser.nextToken(); token != null; token = parser.nextToken()) {
                if (token == JsonToken.FIELD_NAME) {
                    lines.putIfAbsent(path(parser.getParsingContext()), parser.currentTokenLocation().getLineNr());
                }
            }
        } catch (IOException | RuntimeException e) {
            // the config parser reports malformed YAML with its own line; here it only leaves lines out
        }
        return new YamlLines(lines);
    }

    private static List<String> path(JsonStreamContext context) {
        List<String> path = new ArrayList<>();
        for (JsonStreamContext c = context; c != null && !c.inRoot(); c = c.getParent()) {
            path.add(c.inArray() ? Integer.toString(c.getCurrentIndex()) : c.getCurrentName());
        }
        Collections.reverse(path);
        return List.copyOf(path);
    }

    /** The 1-based line of the key at {@code path}, or -1 when there is none. */
    public int line(String... path) {
        return lines.getOrDefault(List.of(path), -1);
    }
}
