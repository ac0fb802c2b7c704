package dev.pressmark.openapi;

import io.swagger.v3.oas.models.media.JsonSchema;
import io.swagger.v3.oas.models.media.Schema;
import java.math.BigDecimal;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Set;

/**
 * JSON Schema 2020-12 pieces as OpenAPI 3.1 writes them. The model classes take raw
 * {@code Schema} in their collections, hence the one suppression here.
 */
@SuppressWarnings({"rawtypes", "unchecked"})
final class Schemas {

    static final String COMPONENTS = "#/components/schemas/";

    private Schemas() {
    }

    static JsonSchema typed(String type, String description) {
        JsonSchema schema = new JsonSchema();
        schema.setTypes(Set.of(type));
        if (description != null) {
            schema.setDescription(description);
        }
        return schema;
    }

    static JsonSchema string(String description) {
        return typed("string", description);
    }

    static JsonSchema integer(String description, long minimum) {
        JsonSchema schema = typed("integer", description);
        schema.setMinimum(BigDecimal.valueOf(minimum));
        return schema;
    }

    /** A JSON number the server writes from a float64. */
    static JsonSchema number(String description) {
        JsonSchema schema = typed("number", description);
        schema.setFormat("double");
        return schema;
    }

    static JsonSchema bool(String description) {
        return typed("boolean", description);
    }

    static JsonSchema ref(String component) {
        JsonSchema schema = new JsonSchema();
        schema.set$ref(COMPONENTS + component);
        return schema;
    }

    static JsonSchema array(String description, Schema<?> items) {
        JsonSchema schema = typed("array", description);
        schema.setItems(items);
        return schema;
    }

    /** An object with these properties (in order); {@code required} names those it always has. */
    static JsonSchema object(String description, List<String> required, Object... namesAndSchemas) {
        JsonSchema schema = typed("object", description);
        LinkedHashMap<String, Schema> properties = new LinkedHashMap<>();
        for (int i = 0; i < namesAndSchemas.length; i += 2) {
            properties.put((String) namesAndSchemas[i], (Schema) namesAndSchemas[i + 1]);
        }
        schema.setProperties(properties);
        if (!required.isEmpty()) {
            schema.setRequired(new ArrayList<>(required));
        }
        return schema;
    }

    /** An object whose members are all of one schema (a JSON map). */
    static JsonSchema map(String description, Schema<?> values) {
        JsonSchema schema = typed("object", description);
        schema.setAdditionalProperties(values);
        return schema;
    }

    static JsonSchema stringEnum(String description, List<String> values) {
        JsonSchema schema = string(description);
        schema.setEnum(new ArrayList<>(values));
        return schema;
    }

    /** {@code schema} or JSON null. */
    static JsonSchema nullable(Schema<?> schema) {
        JsonSchema either = new JsonSchema();
        List<Schema> options = new ArrayList<>();
        options.add(schema);
        options.add(typed("null", null));
        either.setAnyOf(options);
        return either;
    }

    static JsonSchema pattern(JsonSchema schema, String regex) {
        schema.setPattern(regex);
        return schema;
    }

    static JsonSchema format(JsonSchema schema, String format) {
        schema.setFormat(format);
        return schema;
    }

    static JsonSchema additionalProperties(JsonSchema schema, boolean allowed) {
        schema.setAdditionalProperties(allowed);
        return schema;
    }
}
