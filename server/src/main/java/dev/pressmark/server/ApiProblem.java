package dev.pressmark.server;

import com.fasterxml.jackson.databind.node.ObjectNode;
import java.util.List;
import java.util.Objects;

/**
 * A request the service refuses, carrying everything its problem detail needs. Handlers throw
 * it; {@link Problems} turns it and every other failure into the response.
 */
final class ApiProblem extends RuntimeException {

    private static final long serialVersionUID = 1L;

    /** One bad part of a request: a JSON path such as {@code items[2].title}, a query or path parameter, or a header. */
    record FieldError(String field, String message) {
        FieldError {
            Objects.requireNonNull(field, "field");
            Objects.requireNonNull(message, "message");
        }
    }

    private final int status;
    private final String slug;
    private final String title;
    private final transient List<FieldError> errors;
    /** Further members of the problem detail (RFC 9457 section 3.2), such as the checks that refused a promotion. */
    private transient ObjectNode members;
    /** A response header the refusal needs, such as {@code Retry-After}; null when none. */
    private String headerName;
    private String headerValue;

    ApiProblem(int status, String slug, String title, String detail, List<FieldError> errors) {
        super(detail);
        this.status = status;
        this.slug = slug;
        this.title = title;
        this.errors = List.copyOf(errors);
    }

    static ApiProblem invalid(String detail, List<FieldError> errors) {
        return new ApiProblem(400, "invalid-request", "Invalid request", detail, errors);
    }

    static ApiProblem invalidField(String field, String message) {
        return invalid(field + ": " + message, List.of(new FieldError(field, message)));
    }

    static ApiProblem malformedJson(String detail) {
        return new ApiProblem(400, "malformed-json", "Malformed JSON", detail, List.of());
    }

    static ApiProblem notFound(String slug, String detail) {
        return new ApiProblem(404, slug, "Not found", detail, List.of());
    }

    static ApiProblem unauthorized(String detail) {
        return new ApiProblem(401, "unauthorized", "Unauthorized", detail, List.of());
    }

    static ApiProblem forbidden(String slug, String detail) {
        return new ApiProblem(403, slug, "Forbidden", detail, List.of());
    }

    static ApiProblem tooLarge(String detail) {
        return new ApiProblem(413, "body-too-large", "Request body too large", detail, List.of());
    }

    static ApiProblem unsupportedMediaType(String detail) {
        return new ApiProblem(415, "unsupported-media-type", "Unsupported media type", detail,
                List.of(new FieldError("Content-Type", detail)));
    }

    /** The same problem with extension members, written beside the standard ones. */
    ApiProblem withMembers(ObjectNode extra) {
        this.members = extra;
        return this;
    }

    /** The same problem, answered with one more response header. */
    ApiProblem withHeader(String name, String value) {
        this.headerName = Objects.requireNonNull(name, "name");
        this.headerValue = Objects.requireNonNull(value, "value");
        return this;
    }

    /** The same problem, carrying the error behind it for the log. */
    ApiProblem causedBy(Throwable cause) {
        initCause(cause);
        return this;
    }

    String headerName() {
        return headerName;
    }

    String headerValue() {
        return headerValue;
    }

    ObjectNode members() {
        return members;
    }

    static ApiProblem conflict(String slug, String title, String detail) {
        return new ApiProblem(409, slug, title, detail, List.of());
    }

    int status() {
        return status;
    }

    String slug() {
        return slug;
    }

    String title() {
        return title;
    }

    List<FieldError> errors() {
        return errors;
    }
}
