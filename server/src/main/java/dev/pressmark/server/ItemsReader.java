package dev.pressmark.server;

import com.fasterxml.jackson.core.JsonFactory;
import com.fasterxml.jackson.core.JsonParser;
import com.fasterxml.jackson.core.JsonToken;
import java.io.IOException;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;

/**
 * Reads the {@code items} of a predict or explain body in one pass over the parser's tokens, with no
 * JSON tree in between: each item keeps the model's input fields and skips every other member.
 *
 * <p>It answers exactly as reading the whole body into a tree and then walking it would: the
 * whole body is read to its end before any shape error is reported, so a body that is not JSON is
 * always a malformed-JSON problem; a shape error names each bad field, at most
 * {@value #SHOWN_ERRORS} of them, in item order and, inside an item, in the model's field order.
 */
final class ItemsReader {

    /** Enough field errors to fix a request, without an answer the size of the request. */
    static final int SHOWN_ERRORS = 20;

    private final JsonFactory factory;
    private final int maxItems;

    ItemsReader(JsonFactory factory, int maxItems) {
        this.factory = factory;
        this.maxItems = maxItems;
    }

    /** The items of {@code body}, each mapping every field of {@code inputFields} to its text. */
    List<Map<String, String>> read(byte[] body, List<String> inputFields) throws IOException {
        if (body.length == 0) {
            throw ApiProblem.malformedJson("the body is empty; it must be a JSON object");
        }
        try (JsonParser parser = factory.createParser(body)) {
            ApiProblem shape = null;
            List<Map<String, String>> items = null;
            JsonToken first = parser.nextToken();
            if (first != JsonToken.START_OBJECT) {
                parser.skipChildren();
                shape = ApiProblem.invalidField("(body)", "must be a JSON object with an \"items\" array");
            } else {
                Shape read = root(parser, inputFields);
                shape = read.problem;
                items = read.items;
            }
            JsonToken trailing = parser.nextToken();
            if (trailing != null) {
                throw ApiProblem.malformedJson("the body is not valid JSON: trailing token (" + trailing
                        + ") after the JSON value; a body must be a single JSON value");
            }
            if (shape != null) {
                throw shape;
            }
            return items;
        }
    }

    /** What the root object held: the items, or the first shape problem found. */
    private record Shape(List<Map<String, String>> items, ApiProblem problem) {
    }

    private Shape root(JsonParser parser, List<String> inputFields) throws IOException {
        Shape found = null;
        for (String member; (member = parser.nextFieldName()) != null; ) {
            JsonToken value = parser.nextToken();
            if (member.equals("items")) {
                found = value == JsonToken.START_ARRAY ? items(parser, inputFields) : invalidItems(parser);
            } else {
                parser.skipChildren();
            }
        }
        return found != null ? found : new Shape(null, ApiProblem.invalidField("items", "must be an array of objects"));
    }

    private static Shape invalidItems(JsonParser parser) throws IOException {
        parser.skipChildren();
        return new Shape(null, ApiProblem.invalidField("items", "must be an array of objects"));
    }

    private Shape items(JsonParser parser, List<String> inputFields) throws IOException {
        Map<String, Integer> position = new HashMap<>();
        for (int j = 0; j < inputFields.size(); j++) {
            position.put(inputFields.get(j), j);
        }
        List<Map<String, String>> items = new ArrayList<>();
        List<ApiProblem.FieldError> errors = new ArrayList<>();
        int errorCount = 0;
        int count = 0;
        String[] texts = new String[inputFields.size()];
        String[] wrongTypes = new String[inputFields.size()];
        for (JsonToken token; (token = parser.nextToken()) != JsonToken.END_ARRAY; count++) {
            if (count >= maxItems) {
                // Counted to the end, so that the answer says how many there were; nothing more is kept.
                parser.skipChildren();
                continue;
            }
            if (token != JsonToken.START_OBJECT) {
                parser.skipChildren();
                errorCount = addError(errors, errorCount, "items[" + count + "]", "must be an object");
                continue;
            }
            Arrays.fill(texts, null);
            Arrays.fill(wrongTypes, null);
            for (String field; (field = parser.nextFieldName()) != null; ) {
                JsonToken value = parser.nextToken();
                Integer j = position.get(field);
                if (j == null) {
                    parser.skipChildren();
                } else if (value == JsonToken.VALUE_STRING) {
                    texts[j] = parser.getText();
                } else if (value != JsonToken.VALUE_NULL) {
                    wrongTypes[j] = typeName(value);
                    parser.skipChildren();
                }
            }
            Map<String, String> fields = new LinkedHashMap<>();
            for (int j = 0; j < texts.length; j++) {
                String path = "items[" + count + "]." + inputFields.get(j);
                if (texts[j] != null) {
                    fields.put(inputFields.get(j), texts[j]);
                } else if (wrongTypes[j] != null) {
                    errorCount = addError(errors, errorCount, path, "must be a string, was " + wrongTypes[j]);
                } else {
                    errorCount = addError(errors, errorCount, path, "is missing; the model needs " + inputFields);
                }
            }
            items.add(fields);
        }
        if (count > maxItems) {
            return new Shape(null, ApiProblem.invalidField("items", "must have at most " + maxItems + " items, had " + count));
        }
        if (errorCount > 0) {
            return new Shape(null, ApiProblem.invalid(errorCount + " item field(s) are missing or not strings", errors));
        }
        return new Shape(items, null);
    }

    private static int addError(List<ApiProblem.FieldError> errors, int errorCount, String field, String message) {
        if (errors.size() < SHOWN_ERRORS) {
            errors.add(new ApiProblem.FieldError(field, message));
        }
        return errorCount + 1;
    }

    /** The JSON type of a value that starts with {@code token}, as a reader of the body would call it. */
    private static String typeName(JsonToken token) {
        return switch (token) {
            case VALUE_NUMBER_INT, VALUE_NUMBER_FLOAT -> "number";
            case VALUE_TRUE, VALUE_FALSE -> "boolean";
            case START_ARRAY -> "array";
            case START_OBJECT -> "object";
            default -> token.toString().toLowerCase(Locale.ROOT);
        };
    }
}
