package dev.pressmark.server;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.core.StreamReadConstraints;
import com.fasterxml.jackson.core.exc.StreamConstraintsException;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import dev.pressmark.core.PressmarkException;
import dev.pressmark.core.bundle.BundleException;
import dev.pressmark.core.drift.DriftException;
import dev.pressmark.store.StoreException;
import dev.pressmark.store.jdbc.JdbcStores;
import io.javalin.http.Context;
import io.javalin.http.HttpResponseException;
import java.nio.charset.StandardCharsets;
import java.util.List;
import java.util.Map;
import java.util.regex.Pattern;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

/**
 * The one place where a failure becomes a response: an RFC 9457 problem detail
 * ({@code application/problem+json}) with {@code type}, {@code title}, {@code status},
 * {@code detail}, {@code instance} and, when parts of the request were bad, {@code errors}.
 * A failure nobody anticipated is logged with its stack trace and answered with a 500 that
 * names no internals.
 */
final class Problems {

    static final String CONTENT_TYPE = "application/problem+json";
    /** Problem types are URNs: stable identifiers that need no web page to exist. */
    static final String TYPE_PREFIX = "urn:pressmark:problem:";

    /** The problem type of a request that needs the store while it does not answer. */
    static final String STORE_UNAVAILABLE = "store-unavailable";
    /** As long as the server waits at most between two attempts to reach a store that is down. */
    static final String STORE_RETRY_AFTER_SECONDS = String.valueOf(JdbcStores.MAX_RETRY_MS / 1000);

    /** How much of a bad value a problem detail repeats: enough to recognise it, never the whole of a huge one. */
    static final int QUOTED_CHARS = 40;

    private static final Logger LOG = LoggerFactory.getLogger(Problems.class);

    private final ObjectMapper json;

    Problems(ObjectMapper json) {
        this.json = json;
    }

    void handle(Exception failure, Context ctx) {
        ApiProblem problem = toProblem(failure);
        // A refusal for load is expected behaviour, not a failure to investigate.
        if (problem.status() >= 500 && !"busy".equals(problem.slug()) && !STORE_UNAVAILABLE.equals(problem.slug())
                && !BodyBudget.SPENT.equals(problem.slug())
                && !Deadline.EXCEEDED.equals(problem.slug())) {
            LOG.error("{} {} failed", ctx.method(), ctx.path(), failure);
        }
        ObjectNode body = json.createObjectNode();
        body.put("type", TYPE_PREFIX + problem.slug());
        body.put("title", problem.title());
        body.put("status", problem.status());
        body.put("detail", scrub(problem.getMessage()));
        body.put("instance", ctx.path());
        if (!problem.errors().isEmpty()) {
            ArrayNode errors = body.putArray("errors");
            for (ApiProblem.FieldError error : problem.errors()) {
                errors.addObject().put("field", error.field()).put("message", error.message());
            }
        }
        if (STORE_UNAVAILABLE.equals(problem.slug())) {
            ctx.header("Retry-After", STORE_RETRY_AFTER_SECONDS);
        }
        if (problem.members() != null) {
            for (Map.Entry<String, JsonNode> m : problem.members().properties()) {
                if (!body.has(m.getKey())) {
                    body.set(m.getKey(), m.getValue());
                }
            }
        }
        if (problem.headerName() != null) {
            ctx.header(problem.headerName(), problem.headerValue());
        }
        if (problem.status() == 401) {
            ctx.header("WWW-Authenticate", "Bearer");
        }
        if (failure instanceof HttpResponseException e && e.getStatus() == 405 && e.getDetails().get("availableMethods") != null) {
            ctx.header("Allow", e.getDetails().get("availableMethods"));
        }
        // As bytes: a String result goes out in the response's charset, which for this type Jetty takes to be ISO-8859-1.
        ctx.status(problem.status()).contentType(CONTENT_TYPE).result(body.toString().getBytes(StandardCharsets.UTF_8));
    }

    /** {@code value} in double quotes, cut to its first {@value #QUOTED_CHARS} characters with a note of its length when longer. */
    static String quote(String value) {
        if (value.length() <= QUOTED_CHARS) {
            return "\"" + value + "\"";
        }
        int end = Character.isHighSurrogate(value.charAt(QUOTED_CHARS - 1)) ? QUOTED_CHARS - 1 : QUOTED_CHARS;
        return "\"" + value.substring(0, end) + "...\" (" + value.length() + " characters)";
    }

    /**
     * Which of the JSON reader's limits a body passed, in the service's words: the reader's own
     * message names the class and method that hold the limit.
     */
    private static String beyondLimit(StreamConstraintsException e) {
        String message = String.valueOf(e.getOriginalMessage());
        StreamReadConstraints limits = StreamReadConstraints.defaults();
        if (message.startsWith("Number value length")) {
            return "a number has more than the " + limits.getMaxNumberLength() + " characters allowed";
        }
        if (message.startsWith("String value length")) {
            return "a string has more than the " + limits.getMaxStringLength() + " characters allowed";
        }
        if (message.startsWith("Document nesting depth")) {
            return "arrays and objects are nested deeper than the " + limits.getMaxNestingDepth() + " levels allowed";
        }
        return "a value or the document passes one of the reader's limits (length, nesting)";
    }

    /** Java class names (a package path ending in a capitalised name) and code quoted in backticks: neither belongs in an answer. */
    private static final Pattern INTERNALS = Pattern.compile("`[^`]*`|\\b(?:[a-z][a-z0-9_]*\\.){2,}[A-Z][A-Za-z0-9_$]*(?:\\.[a-z][A-Za-z0-9_]*\\(\\))?");

    /** {@code detail} with any library internal a message brought along taken out. */
    static String scrub(String detail) {
        return detail == null ? "" : INTERNALS.matcher(detail).replaceAll("(internal)");
    }

    static ApiProblem toProblem(Exception failure) {
        if (failure instanceof ApiProblem problem) {
            return problem;
        }
        if (failure instanceof StoreException e) {
            return fromStore(e);
        }
        if (failure instanceof DriftException e) {
            return new ApiProblem(500, "drift-profile", "Training profile unusable", e.getMessage(), List.of());
        }
        if (failure instanceof BundleException e) {
            return new ApiProblem(400, "not-a-bundle", "Not a usable bundle", e.getMessage(), List.of());
        }
        if (failure instanceof StreamConstraintsException e) {
            return ApiProblem.malformedJson("the body is not valid JSON for this server: " + beyondLimit(e));
        }
        if (failure instanceof JsonProcessingException e) {
            return ApiProblem.malformedJson("the body is not valid JSON: " + e.getOriginalMessage());
        }
        if (failure instanceof HttpResponseException e) {
            return fromFramework(e);
        }
        if (failure instanceof PressmarkException e) {
            return new ApiProblem(500, "internal", "Internal error", "the request failed (" + e.code() + ")", List.of());
        }
        return new ApiProblem(500, "internal", "Internal error", "the request failed; the server log has the details", List.of());
    }

    private static ApiProblem fromStore(StoreException e) {
        return switch (e.code()) {
            case StoreException.NO_SUCH_MODEL -> ApiProblem.notFound("no-such-model", e.getMessage());
            case StoreException.NO_SUCH_VERSION -> ApiProblem.notFound("no-such-version", e.getMessage());
            case StoreException.INVALID_NAME -> ApiProblem.invalidField("name", e.getMessage());
            case StoreException.INVALID_TAG -> ApiProblem.invalidField("tag", e.getMessage());
            case StoreException.NOT_A_BUNDLE -> new ApiProblem(400, "not-a-bundle", "Not a usable bundle", e.getMessage(), List.of());
            case StoreException.UNUSABLE -> new ApiProblem(422, e.code(), "Bundle does not load", e.getMessage(), List.of());
            case StoreException.LIMIT -> new ApiProblem(422, e.code(), "Bundle beyond a limit", e.getMessage(), List.of());
            case StoreException.ACTIVE_CHANGED -> new ApiProblem(409, e.code(), "Active version changed", e.getMessage(), List.of());
            case StoreException.TAG_EXISTS -> new ApiProblem(409, "tag-exists", "Tag already published", e.getMessage(), List.of());
            case StoreException.INVALID_FRACTION -> ApiProblem.invalidField("fraction", e.getMessage());
            case StoreException.NO_ACTIVE, StoreException.SHADOW_OF_ACTIVE ->
                    new ApiProblem(409, e.code(), "Conflict with the active version", e.getMessage(), List.of());
            case StoreException.BREAKING -> new ApiProblem(409, e.code(), "Breaking contract change", e.getMessage()
                    + " (add ?allow_breaking=true to publish it anyway)", List.of());
            case StoreException.UNSIGNED, StoreException.BAD_SIGNATURE -> new ApiProblem(422, e.code(), "Signature refused", e.getMessage(),
                    List.of());
            case StoreException.INVALID_REASON -> ApiProblem.invalidField("reason", e.getMessage());
            case StoreException.RETIRED, StoreException.ALREADY_RETIRED, StoreException.ACTIVE, StoreException.NO_ROLLBACK ->
                    new ApiProblem(409, e.code(), "Conflict with the version history", e.getMessage(), List.of());
            case StoreException.UNREACHABLE -> new ApiProblem(503, STORE_UNAVAILABLE, "Store unavailable",
                    "the store does not answer now; the versions already loaded go on serving predictions", List.of());
            case StoreException.READ_ONLY ->
                    new ApiProblem(503, e.code(), "Store unavailable", "the store cannot serve this request now (" + e.code() + ")", List.of());
            // 507 Insufficient Storage (RFC 4918, section 11.5): the server cannot store what the request needs stored
            case StoreException.STORAGE_FULL -> new ApiProblem(507, e.code(), "Store full", e.getMessage(), List.of());
            case StoreException.CORRUPT -> new ApiProblem(500, e.code(), "Stored version corrupt", e.getMessage(), List.of());
            default -> new ApiProblem(500, "internal", "Internal error", "the store failed (" + e.code() + ")", List.of());
        };
    }

    private static ApiProblem fromFramework(HttpResponseException e) {
        int status = e.getStatus();
        return switch (status) {
            case 404 -> ApiProblem.notFound("no-such-endpoint", e.getMessage());
            case 405 -> new ApiProblem(405, "method-not-allowed", "Method not allowed", e.getDetails().get("availableMethods") == null
                    ? e.getMessage() : "this path answers " + e.getDetails().get("availableMethods") + " only", List.of());
            case 413 -> ApiProblem.tooLarge(e.getMessage());
            default -> new ApiProblem(status, "http-" + status, "HTTP " + status, e.getMessage(), List.of());
        };
    }
}
