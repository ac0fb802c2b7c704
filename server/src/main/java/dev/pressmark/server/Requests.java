package dev.pressmark.server;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.pressmark.store.Shadow;
import dev.pressmark.openapi.ApiDocument;
import io.javalin.http.Context;
import java.io.CharConversionException;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.Base64;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Optional;
import java.util.Set;

/** Reading and checking request bodies: content type, size limit, JSON shape. */
final class Requests {

    static final String JSON = "application/json";
    static final Set<String> BUNDLE_TYPES = Set.of("application/octet-stream", "application/zip");
    /**
     * A text is cut while it is read after this many characters per token scored: a token of
     * ordinary text takes 4 to 10 characters with its space, so the cut text still holds every
     * token the scorer keeps; only a text of words longer than this (scored as unknown tokens)
     * keeps fewer.
     */
    static final int CHARS_PER_SCORED_TOKEN = 64;
    /** Enough for a sentence or two in the events. */
    static final int MAX_REASON_CHARS = 1_000;

    private final ObjectMapper json;
    private final Bodies bodies;
    private final ItemsReader items;
    private final long maxJsonBytes;
    private final long maxBundleBytes;
    private final int maxTokensPerField;

    Requests(ObjectMapper json, ServerConfig config, Bodies bodies) {
        this.json = json;
        this.bodies = bodies;
        this.items = new ItemsReader(json.getFactory(), config.limits().maxItems(),
                (int) Math.min(Integer.MAX_VALUE, (long) config.limits().maxTokensPerField() * CHARS_PER_SCORED_TOKEN));
        this.maxJsonBytes = config.limits().maxJsonBytes();
        this.maxBundleBytes = config.limits().maxBundleBytes();
        this.maxTokensPerField = config.limits().maxTokensPerField();
    }

    /** How many tokens of each text field are scored. */
    int maxTokensPerField() {
        return maxTokensPerField;
    }

    /** The body as JSON, after checking that it says it is JSON and fits the JSON body limit. */
    JsonNode jsonBody(Context ctx) throws IOException {
        requireType(ctx, Set.of(JSON));
        return parseJson(bodies.read(ctx, maxJsonBytes, null));
    }

    /** A body already read within its limit, as JSON; a body that is not a JSON text is a 400. */
    JsonNode parseJson(byte[] body) throws IOException {
        if (body.length == 0) {
            throw ApiProblem.malformedJson("the body is empty; it must be a JSON object");
        }
        try {
            return json.readTree(body);
        } catch (CharConversionException e) {
            throw notJsonText(e);
        }
    }

    /**
     * The parser guesses UTF-16 or UTF-32 from the first four bytes and reports a code unit it cannot
     * decode as a plain IOException rather than a parse error, which would be a 500.
     */
    private static ApiProblem notJsonText(CharConversionException e) {
        return ApiProblem.malformedJson("the body is not valid JSON text: " + e.getMessage());
    }

    /** The body as a bundle file, up to the bundle body limit. */
    byte[] bundleBody(Context ctx) {
        requireType(ctx, BUNDLE_TYPES);
        return bodies.read(ctx, maxBundleBytes, null);
    }

    /**
     * The {@code items} of a predict or explain request, each mapping every input field of the model
     * to its text; the body must arrive before {@code deadline}.
     */
    ItemsReader.Items items(Context ctx, List<String> inputFields, Deadline deadline) throws IOException {
        requireType(ctx, Set.of(JSON));
        return readItems(bodies.read(ctx, maxJsonBytes, deadline), inputFields);
    }

    /** The {@code items} of a body already read within its limit. */
    List<Map<String, String>> items(byte[] body, List<String> inputFields) throws IOException {
        return readItems(body, inputFields).list();
    }

    private ItemsReader.Items readItems(byte[] body, List<String> inputFields) throws IOException {
        try {
            return items.readItems(body, inputFields);
        } catch (CharConversionException e) {
            throw notJsonText(e);
        }
    }

    /** The body of {@code PUT /models/{name}/active}. */
    record ActivateBody(String tag, boolean force, String reason) {
    }

    /** The body of {@code PUT /models/{name}/shadow}. */
    record ShadowBody(String tag, double fraction) {
    }

    /** {@code {"tag": "...", "force": false, "reason": "..."}}; forcing needs a reason. */
    static ActivateBody activateBody(JsonNode body) {
        onlyMembers(body, Set.of("tag", "force", "reason"));
        String tag = requiredString(body, "tag");
        JsonNode force = body.get("force");
        if (force != null && !force.isBoolean()) {
            throw ApiProblem.invalidField("force", "must be true or false");
        }
        JsonNode reason = body.get("reason");
        if (reason != null && !reason.isTextual()) {
            throw ApiProblem.invalidField("reason", "must be a string");
        }
        boolean forced = force != null && force.booleanValue();
        String why = reason == null ? "" : reason.textValue().strip();
        if (forced && why.isEmpty()) {
            throw ApiProblem.invalidField("reason", "is required with \"force\": true, and goes into the events");
        }
        if (why.length() > MAX_REASON_CHARS) {
            throw ApiProblem.invalidField("reason", "must have at most " + MAX_REASON_CHARS + " characters, had " + why.length());
        }
        return new ActivateBody(tag, forced, why);
    }

    /**
     * {@code {"reason": "..."}}, the body of {@code POST /models/{name}/versions/{tag}/retire}: the
     * reason as given; the store decides whether it is one ({@link dev.pressmark.store.Names#requiredReason}).
     */
    static String retireReason(JsonNode body) {
        onlyMembers(body, Set.of("reason"));
        return requiredString(body, "reason");
    }

    /** {@code {"tag": "...", "fraction": 0.2}}; the fraction is in (0, 1] and defaults to {@link Shadow#DEFAULT_FRACTION}. */
    static ShadowBody shadowBody(JsonNode body) {
        onlyMembers(body, Set.of("tag", "fraction"));
        String tag = requiredString(body, "tag");
        JsonNode fraction = body.get("fraction");
        if (fraction == null) {
            return new ShadowBody(tag, Shadow.DEFAULT_FRACTION);
        }
        if (!fraction.isNumber() || !(fraction.doubleValue() > 0 && fraction.doubleValue() <= 1)) {
            throw ApiProblem.invalidField("fraction", "must be a number in (0, 1], the share of requests scored, was "
                    + Problems.quote(fraction.toString()));
        }
        return new ShadowBody(tag, fraction.doubleValue());
    }

    /** Refuses a body that is not an object or has a member not in {@code allowed}, naming each. */
    private static void onlyMembers(JsonNode body, Set<String> allowed) {
        if (!body.isObject()) {
            throw ApiProblem.invalidField("(body)", "must be a JSON object with members " + allowed.stream().sorted().toList());
        }
        List<ApiProblem.FieldError> unknown = new ArrayList<>();
        body.fieldNames().forEachRemaining(name -> {
            if (!allowed.contains(name)) {
                unknown.add(new ApiProblem.FieldError(name, "is not a member of this body; allowed: " + allowed.stream().sorted().toList()));
            }
        });
        if (!unknown.isEmpty()) {
            throw ApiProblem.invalid(unknown.size() + " unknown member(s) in the body", unknown);
        }
    }

    /** A string member of a JSON object body. */
    static String requiredString(JsonNode body, String field) {
        JsonNode value = body.isObject() ? body.get(field) : null;
        if (value == null || !value.isTextual()) {
            throw ApiProblem.invalidField(field, "must be a string");
        }
        return value.textValue();
    }

    /**
     * The signature file carried by the {@value ApiDocument#SIGNATURE_HEADER} header, base64url-encoded
     * (RFC 4648 section 5, padding optional); empty when the header is absent.
     */
    static Optional<String> signatureHeader(Context ctx) {
        String raw = ctx.header(ApiDocument.SIGNATURE_HEADER);
        if (raw == null) {
            return Optional.empty();
        }
        try {
            return Optional.of(new String(Base64.getUrlDecoder().decode(raw.strip()), StandardCharsets.UTF_8));
        } catch (IllegalArgumentException e) {
            throw ApiProblem.invalidField(ApiDocument.SIGNATURE_HEADER, "must be the signature file in base64url (RFC 4648 section 5): "
                    + e.getMessage());
        }
    }

    /** A boolean query parameter, {@code true} or {@code false}; false when absent. */
    static boolean booleanQuery(Context ctx, String name) {
        String raw = ctx.queryParam(name);
        if (raw == null) {
            return false;
        }
        return switch (raw) {
            case "true" -> true;
            case "false" -> false;
            default -> throw ApiProblem.invalidField(name, "must be true or false, was " + Problems.quote(raw));
        };
    }

    /** An integer query parameter within {@code [min, max]}. */
    static int intQuery(Context ctx, String name, int fallback, int min, int max) {
        String raw = ctx.queryParam(name);
        if (raw == null) {
            return fallback;
        }
        int value;
        try {
            value = Integer.parseInt(raw);
        } catch (NumberFormatException e) {
            throw ApiProblem.invalidField(name, "must be an integer, was " + Problems.quote(raw));
        }
        if (value < min || value > max) {
            throw ApiProblem.invalidField(name, "must be in [" + min + ", " + max + "], was " + value);
        }
        return value;
    }

    private static void requireType(Context ctx, Set<String> accepted) {
        String header = ctx.header("Content-Type");
        String type = header == null ? "" : header.split(";", 2)[0].strip().toLowerCase(Locale.ROOT);
        if (!accepted.contains(type)) {
            throw ApiProblem.unsupportedMediaType("Content-Type must be " + String.join(" or ", accepted.stream().sorted().toList())
                    + ", was " + (header == null ? "missing" : Problems.quote(header)));
        }
    }
}
