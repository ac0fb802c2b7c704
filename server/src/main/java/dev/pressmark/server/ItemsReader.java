package dev.pressmark.server;

import com.fasterxml.jackson.core.JsonFactory;
import com.fasterxml.jackson.core.JsonParser;
import com.fasterxml.jackson.core.JsonToken;
import java.io.IOException;
import java.io.Writer;
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
 *
 * <p>A text longer than {@code maxFieldChars} is cut while it is read, at the last white space in
 * its second half where there is one, so that a huge text is never tokenised whole: only its first
 * tokens are scored anyway. What was cut is counted in white-space separated words, each at least
 * one token, and reported with the tokens the scorer cuts ({@link Items#cutWords}).
 */
final class ItemsReader {

    /** Enough field errors to fix a request, without an answer the size of the request. */
    static final int SHOWN_ERRORS = 20;

    private final JsonFactory factory;
    private final int maxItems;
    private final int maxFieldChars;

    /**
     * The items of a body, and per item the words cut from its over-long texts while reading;
     * {@code cutWords} is null when no text was cut, as it almost never is.
     */
    record Items(List<Map<String, String>> list, int[] cutWords) {

        /** Words cut from item {@code i}'s texts while reading. */
        int cutWords(int i) {
            return cutWords == null || i >= cutWords.length ? 0 : cutWords[i];
        }
    }

    ItemsReader(JsonFactory factory, int maxItems) {
        this(factory, maxItems, Integer.MAX_VALUE);
    }

    ItemsReader(JsonFactory factory, int maxItems, int maxFieldChars) {
        if (maxFieldChars < 2) {
            throw new IllegalArgumentException("maxFieldChars must be >= 2 characters, was " + maxFieldChars);
        }
        this.factory = factory;
        this.maxItems = maxItems;
        this.maxFieldChars = maxFieldChars;
    }

    /** The items of {@code body}, each mapping every field of {@code inputFields} to its text. */
    List<Map<String, String>> read(byte[] body, List<String> inputFields) throws IOException {
        return readItems(body, inputFields).list();
    }

    /** {@link #read}, with what was cut from over-long texts. */
    Items readItems(byte[] body, List<String> inputFields) throws IOException {
        if (body.length == 0) {
            throw ApiProblem.malformedJson("the body is empty; it must be a JSON object");
        }
        try (JsonParser parser = factory.createParser(body)) {
            ApiProblem shape = null;
            Items items = null;
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
    private record Shape(Items items, ApiProblem problem) {
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
        int[] cutWords = null;
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
                    if (parser.getTextLength() <= maxFieldChars) {
                        texts[j] = parser.getText();
                    } else {
                        if (cutWords == null) {
                            cutWords = new int[Math.min(maxItems, 16)];
                        }
                        if (count >= cutWords.length) {
                            cutWords = Arrays.copyOf(cutWords, Math.min(maxItems, Math.max(count + 1, cutWords.length * 2)));
                        }
                        texts[j] = cut(parser, count, cutWords);
                    }
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
        return new Shape(new Items(items, cutWords), null);
    }

    /** The first {@link #maxFieldChars} or fewer characters of the parser's over-long text; the words after them go into {@code cutWords[item]}. */
    private String cut(JsonParser parser, int item, int[] cutWords) throws IOException {
        Cut cut = new Cut(maxFieldChars);
        // streamed from the parser's buffer: the whole text never becomes one array or string
        parser.getText(cut);
        return cut.finish(item, cutWords);
    }

    /** Keeps a text's first characters and counts the words of the rest as they stream past. */
    private static final class Cut extends Writer {
        private final char[] head;
        private int headLength;
        private int restWords;
        private boolean restStarted;
        private boolean inWord;

        Cut(int maxChars) {
            this.head = new char[maxChars + 1];
        }

        @Override
        public void write(char[] chars, int offset, int length) {
            int i = offset;
            int end = offset + length;
            while (i < end && headLength < head.length) {
                head[headLength++] = chars[i++];
            }
            if (i < end && !restStarted) {
                restStarted = true;
                inWord = !Character.isWhitespace(head[head.length - 1]); // a word across the boundary counts once, in the head
            }
            for (; i < end; i++) {
                boolean white = Character.isWhitespace(chars[i]);
                restWords += !white && !inWord ? 1 : 0;
                inWord = !white;
            }
        }

        /** The kept text, cut at the last white space in its second half where there is one; adds the words cut to {@code cutWords[item]}. */
        String finish(int item, int[] cutWords) {
            int at = head.length - 1;
            int space = at;
            while (space > at / 2 && !Character.isWhitespace(head[space])) {
                space--;
            }
            if (Character.isWhitespace(head[space])) {
                at = space;
            } else if (Character.isHighSurrogate(head[at - 1])) {
                at--; // never half a character
            }
            int words = restWords;
            boolean word = false;
            for (int i = at; i < headLength; i++) {
                boolean white = Character.isWhitespace(head[i]);
                words += !white && !word ? 1 : 0;
                word = !white;
            }
            cutWords[item] += words;
            return new String(head, 0, at);
        }

        @Override
        public void flush() {
        }

        @Override
        public void close() {
        }
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
