package dev.pressmark.server;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import net.jqwik.api.Arbitraries;
import net.jqwik.api.Arbitrary;
import net.jqwik.api.Combinators;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.Provide;
import net.jqwik.api.Tuple;
import org.junit.jupiter.api.Test;

/**
 * The one-pass items reader against a reference outside it: Jackson's own tree reader (databind's
 * {@code readTree} with the service's settings) followed by a plain walk of the tree. For any body,
 * both give the same items or the same problem.
 */
class ItemsReaderTest {

    private static final List<String> FIELDS = List.of("title", "brand");
    private static final int MAX_ITEMS = 4;
    private static final ObjectMapper JSON = PressmarkServer.jsonMapper();
    private static final ItemsReader READER = new ItemsReader(JSON.getFactory(), MAX_ITEMS);

    @Test
    void reads_each_items_input_fields_and_skips_every_other_member() throws Exception {
        String body = "{\"meta\":{\"x\":[1,2,{\"y\":null}]},\"items\":[{\"brand\":\"Acme\",\"title\":\"brass valve\",\"n\":3},"
                + "{\"title\":\"\\u00e9tag\\u00e8re\",\"brand\":\"\"}],\"tail\":true}";
        assertThat(READER.read(body.getBytes(StandardCharsets.UTF_8), FIELDS)).containsExactly(
                Map.of("title", "brass valve", "brand", "Acme"), Map.of("title", "\u00e9tag\u00e8re", "brand", ""));
    }

    @Test
    void names_every_bad_field_in_item_order_then_field_order() {
        String body = "{\"items\":[{\"brand\":1},7,{\"title\":\"ok\",\"brand\":null}]}";
        assertThat(outcome(body, true)).isEqualTo(List.of("problem", 400, "invalid-request", "4 item field(s) are missing or not strings",
                List.of(new ApiProblem.FieldError("items[0].title", "is missing; the model needs [title, brand]"),
                        new ApiProblem.FieldError("items[0].brand", "must be a string, was number"),
                        new ApiProblem.FieldError("items[1]", "must be an object"),
                        new ApiProblem.FieldError("items[2].brand", "is missing; the model needs [title, brand]"))));
    }

    @Test
    void a_syntax_error_after_a_shape_error_is_still_malformed_json() {
        assertThat(outcome("[1, 2", true)).isEqualTo(List.of("malformed"));
        assertThat(outcome("{\"items\": 3, \"x\": [}", true)).isEqualTo(List.of("malformed"));
    }

    @Property(tries = 3000)
    void answers_as_the_tree_reader_does(@ForAll("bodies") String body) {
        assertThat(outcome(body, true)).isEqualTo(outcome(body, false));
    }

    /** The result as comparable values: the items, a problem's members, or "malformed" for a body that is not JSON. */
    private static List<Object> outcome(String body, boolean streaming) {
        byte[] bytes = body.getBytes(StandardCharsets.UTF_8);
        try {
            return List.of("items", streaming ? READER.read(bytes, FIELDS) : treeItems(bytes));
        } catch (Exception e) {
            ApiProblem problem = Problems.toProblem(e);
            if (problem.slug().equals("malformed-json")) {
                return List.of("malformed");
            }
            return List.of("problem", problem.status(), problem.slug(), problem.getMessage(), problem.errors());
        }
    }

    /** The reference: the whole body as a tree, then the walk the service did before it read items in one pass. */
    private static List<Map<String, String>> treeItems(byte[] bytes) throws Exception {
        if (bytes.length == 0) {
            throw ApiProblem.malformedJson("the body is empty");
        }
        JsonNode body = JSON.readTree(bytes);
        if (!body.isObject()) {
            throw ApiProblem.invalidField("(body)", "must be a JSON object with an \"items\" array");
        }
        JsonNode items = body.get("items");
        if (items == null || !items.isArray()) {
            throw ApiProblem.invalidField("items", "must be an array of objects");
        }
        if (items.size() > MAX_ITEMS) {
            throw ApiProblem.invalidField("items", "must have at most " + MAX_ITEMS + " items, had " + items.size());
        }
        List<ApiProblem.FieldError> errors = new ArrayList<>();
        List<Map<String, String>> parsed = new ArrayList<>();
        for (int i = 0; i < items.size(); i++) {
            JsonNode item = items.get(i);
            if (!item.isObject()) {
                errors.add(new ApiProblem.FieldError("items[" + i + "]", "must be an object"));
                continue;
            }
            Map<String, String> fields = new LinkedHashMap<>();
            for (String field : FIELDS) {
                JsonNode value = item.get(field);
                if (value == null || value.isNull()) {
                    errors.add(new ApiProblem.FieldError("items[" + i + "]." + field, "is missing; the model needs " + FIELDS));
                } else if (!value.isTextual()) {
                    errors.add(new ApiProblem.FieldError("items[" + i + "]." + field, "must be a string, was "
                            + value.getNodeType().toString().toLowerCase(Locale.ROOT)));
                } else {
                    fields.put(field, value.textValue());
                }
            }
            parsed.add(fields);
        }
        if (!errors.isEmpty()) {
            throw ApiProblem.invalid(errors.size() + " item field(s) are missing or not strings",
                    errors.subList(0, Math.min(errors.size(), ItemsReader.SHOWN_ERRORS)));
        }
        return parsed;
    }

    @Provide
    Arbitrary<String> bodies() {
        Arbitrary<String> root = Arbitraries.frequencyOf(
                Tuple.of(8, object(items(), 3)),
                Tuple.of(1, value(2)),
                Tuple.of(1, Arbitraries.of("", " ", "{", "{\"items\":[", "{\"items\":[{\"title\":\"a\"}]}}", "nul")));
        Arbitrary<String> tail = Arbitraries.of("", "", "", " ", "\n", " x", "{}", "]");
        Arbitrary<Integer> cut = Arbitraries.integers().between(0, 20);
        return Combinators.combine(root, tail, cut).as((r, t, c) -> c == 0 && r.length() > 1 ? r.substring(0, r.length() / 2) : r + t);
    }

    /** A root object whose members are {@code items} (maybe twice, maybe not an array) and noise. */
    private static Arbitrary<String> object(Arbitrary<String> items, int members) {
        Arbitrary<String> member = Arbitraries.frequencyOf(
                Tuple.of(5, items.map(v -> "\"items\":" + v)),
                Tuple.of(2, value(2).map(v -> "\"meta\":" + v)),
                Tuple.of(1, value(1).map(v -> "\"items\":" + v)));
        return member.list().ofMinSize(0).ofMaxSize(members).map(list -> "{" + String.join(",", list) + "}");
    }

    private static Arbitrary<String> items() {
        Arbitrary<String> item = Arbitraries.frequencyOf(
                Tuple.of(8, itemObject()),
                Tuple.of(1, value(1)));
        return item.list().ofMinSize(0).ofMaxSize(MAX_ITEMS + 2).map(list -> "[" + String.join(",", list) + "]");
    }

    private static Arbitrary<String> itemObject() {
        Arbitrary<String> name = Arbitraries.of("title", "brand", "title", "other", "Title");
        Arbitrary<String> member = Combinators.combine(name, Arbitraries.frequencyOf(
                Tuple.of(6, text()), Tuple.of(2, value(1)))).as((n, v) -> "\"" + n + "\":" + v);
        return member.list().ofMinSize(0).ofMaxSize(4).map(list -> "{" + String.join(",", list) + "}");
    }

    private static Arbitrary<String> text() {
        return Arbitraries.strings().withChars("ab \u00e9\"\\\u4e2d").ofMaxLength(6)
                .map(s -> "\"" + s.replace("\\", "\\\\").replace("\"", "\\\"") + "\"");
    }

    /** Any JSON value up to {@code depth} levels deep. */
    private static Arbitrary<String> value(int depth) {
        Arbitrary<String> scalar = Arbitraries.of("null", "true", "false", "0", "-1.5e3", "12345678901234567890", "\"x\"", "\"\"");
        if (depth == 0) {
            return scalar;
        }
        Arbitrary<String> array = value(depth - 1).list().ofMaxSize(3).map(l -> "[" + String.join(",", l) + "]");
        Arbitrary<String> object = value(depth - 1).list().ofMaxSize(3).map(l -> {
            StringBuilder s = new StringBuilder("{");
            for (int i = 0; i < l.size(); i++) {
                s.append(i == 0 ? "" : ",").append("\"k").append(i).append("\":").append(l.get(i));
            }
            return s.append("}").toString();
        });
        return Arbitraries.oneOf(scalar, array, object);
    }
}
