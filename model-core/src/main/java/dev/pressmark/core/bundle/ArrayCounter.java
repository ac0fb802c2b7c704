package dev.pressmark.core.bundle;

import com.fasterxml.jackson.core.JsonFactory;
import com.fasterxml.jackson.core.JsonParser;
import com.fasterxml.jackson.core.JsonToken;
import java.io.IOException;

/**
 * Counts the elements of one array member of a JSON object by streaming over its tokens, without
 * building them, and stops as soon as the count passes a limit: the check that runs before an
 * entry is bound to objects, so a vocabulary of ten million tokens costs a scan, not the heap.
 */
final class ArrayCounter {

    private static final JsonFactory FACTORY = new JsonFactory();

    private ArrayCounter() {
    }

    /**
     * Refuses {@code json} when its members named {@code field}, at any depth (the vocabularies of
     * several views sit one level down), are arrays of more than {@code max} elements together;
     * anything else (not an object, no such member, malformed JSON) is left for the binding that
     * follows to report. The refusal says {@code "<entry>: <field> has more than <max> <unit>, the
     * limit on <limit>"}.
     */
    static void requireAtMost(byte[] json, String entry, String field, int max, String unit, String limit) throws IOException {
        try (JsonParser parser = FACTORY.createParser(json)) {
            if (parser.nextToken() != JsonToken.START_OBJECT) {
                return;
            }
            long count = 0;
            for (JsonToken token = parser.nextToken(); token != null; token = parser.nextToken()) {
                if (token != JsonToken.FIELD_NAME || !parser.currentName().equals(field)) {
                    continue;
                }
                if (parser.nextToken() != JsonToken.START_ARRAY) {
                    parser.skipChildren();
                    continue;
                }
                for (JsonToken element = parser.nextToken(); element != JsonToken.END_ARRAY && element != null; element = parser.nextToken()) {
                    parser.skipChildren();
                    if (++count > max) {
                        throw BundleLimits.exceeded(String.format("%s: %s has more than %,d %s, the limit on %s", entry, field, max, unit, limit));
                    }
                }
            }
        }
    }
}
