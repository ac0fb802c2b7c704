package dev.pressmark.openapi;

import io.swagger.v3.oas.models.Components;
import io.swagger.v3.oas.models.Operation;
import io.swagger.v3.oas.models.headers.Header;
import io.swagger.v3.oas.models.media.Content;
import io.swagger.v3.oas.models.media.MediaType;
import io.swagger.v3.oas.models.media.Schema;
import io.swagger.v3.oas.models.parameters.Parameter;
import io.swagger.v3.oas.models.responses.ApiResponse;
import io.swagger.v3.oas.models.responses.ApiResponses;
import io.swagger.v3.oas.models.security.SecurityRequirement;
import io.swagger.v3.oas.models.security.SecurityScheme;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;

/** Pieces of operations: JSON answers, the shared problem answers, path parameters, the bearer scheme. */
final class Ops {

    static final String JSON = "application/json";
    static final String PROBLEM_JSON = "application/problem+json";
    static final String BEARER = "bearer";
    private static final String RESPONSES = "#/components/responses/";

    /** Every problem answer the service gives, by status: the component's name and when it comes. */
    private static final Map<Integer, String[]> PROBLEMS = new TreeMap<>(Map.ofEntries(
            Map.entry(400, new String[] {"BadRequest", "The request is malformed or a part of it is invalid; errors names each bad field."}),
            Map.entry(401, new String[] {"Unauthorized", "The bearer token is missing or wrong."}),
            Map.entry(403, new String[] {"Forbidden", "The admin endpoints are disabled: the server has no admin token."}),
            Map.entry(404, new String[] {"NotFound", "No such model, version, active version or shadow."}),
            Map.entry(409, new String[] {"Conflict", "The change conflicts with the version history (tag exists, version retired or retired"
                    + " already, retiring the active version, nothing to roll back to,"
                    + " shadow of the active version), breaks the active version's contract without allow_breaking,"
                    + " or the promotion check refused it (checks says why)."}),
            Map.entry(413, new String[] {"TooLarge", "The body is over the server's limit."}),
            Map.entry(415, new String[] {"UnsupportedMediaType", "The body's Content-Type is not one this endpoint reads."}),
            Map.entry(422, new String[] {"SignatureRefused", "The store trusts signing keys and the bundle is unsigned, or its signature is malformed,"
                    + " by a key the store does not trust, or does not verify over the bundle's SHA-256."}),
            Map.entry(500, new String[] {"InternalError", "The server failed; its log has the details."}),
            Map.entry(503, new String[] {"StoreUnavailable", "Not now: the store does not answer (store-unavailable, with Retry-After), the server is"
                    + " serving its limit of model requests (busy, with Retry-After), or the request ran past its deadline (deadline-exceeded)."}),
            Map.entry(507, new String[] {"StoreFull", "The disk holding the store is full; nothing was written."})));

    private Ops() {
    }

    static Operation operation(String id, String tag, String summary, String description) {
        Operation operation = new Operation();
        operation.setOperationId(id);
        operation.setTags(new ArrayList<>(List.of(tag)));
        operation.setSummary(summary);
        operation.setDescription(description);
        operation.setResponses(new ApiResponses());
        return operation;
    }

    static Content content(String type, Schema<?> schema) {
        MediaType media = new MediaType();
        media.setSchema(schema);
        Content content = new Content();
        content.addMediaType(type, media);
        return content;
    }

    static ApiResponse answer(String description, String type, Schema<?> schema) {
        ApiResponse response = new ApiResponse();
        response.setDescription(description);
        response.setContent(content(type, schema));
        return response;
    }

    static ApiResponse json(String description, Schema<?> schema) {
        return answer(description, JSON, schema);
    }

    /** Adds the shared problem answers for {@code statuses}. */
    static void problems(Operation operation, int... statuses) {
        for (int status : statuses) {
            String[] problem = PROBLEMS.get(status);
            if (problem == null) {
                throw new IllegalArgumentException("status must be one of " + PROBLEMS.keySet() + ", was " + status);
            }
            ApiResponse response = new ApiResponse();
            response.set$ref(RESPONSES + problem[0]);
            operation.getResponses().addApiResponse(Integer.toString(status), response);
        }
    }

    /** Requires the bearer token, and says what its absence answers. */
    static void secured(Operation operation) {
        operation.setSecurity(new ArrayList<>(List.of(new SecurityRequirement().addList(BEARER))));
        problems(operation, 401);
    }

    static Parameter pathParameter(String name, String description, String pattern) {
        Parameter parameter = new Parameter();
        parameter.setName(name);
        parameter.setIn("path");
        parameter.setRequired(true);
        parameter.setDescription(description);
        parameter.setSchema(Schemas.pattern(Schemas.string(null), pattern));
        return parameter;
    }

    /** The problem answers and the bearer scheme, as components that the operations refer to. */
    static void addTo(Components components) {
        for (Map.Entry<Integer, String[]> problem : PROBLEMS.entrySet()) {
            ApiResponse response = answer(problem.getValue()[1], PROBLEM_JSON, Schemas.ref(Shapes.PROBLEM));
            if (problem.getKey() == 401) {
                Header challenge = new Header();
                challenge.setDescription("Bearer: the scheme the token must be sent in.");
                challenge.setSchema(Schemas.string(null));
                response.addHeaderObject("WWW-Authenticate", challenge);
            }
            components.addResponses(problem.getValue()[0], response);
        }
        SecurityScheme bearer = new SecurityScheme();
        bearer.setType(SecurityScheme.Type.HTTP);
        bearer.setScheme("bearer");
        bearer.setDescription("Authorization: Bearer <token>. Admin endpoints need the admin token; reading endpoints need the reader "
                + "token (or the admin token) when the server has a reader token.");
        components.addSecuritySchemes(BEARER, bearer);
    }
}
