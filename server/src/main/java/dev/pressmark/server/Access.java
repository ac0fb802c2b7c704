package dev.pressmark.server;

import io.javalin.http.Context;
import java.util.Optional;

/** Who may call what: admin endpoints need the admin token; reading endpoints need the reader token when one is set. */
final class Access {

    private static final String BEARER = "Bearer ";

    private final Optional<BearerToken> admin;
    private final Optional<BearerToken> reader;

    Access(Optional<BearerToken> admin, Optional<BearerToken> reader) {
        this.admin = admin;
        this.reader = reader;
    }

    void requireAdmin(Context ctx) {
        if (admin.isEmpty()) {
            throw ApiProblem.forbidden("admin-disabled", "the admin endpoints are disabled: start the server with --admin-token-file FILE "
                    + "or the environment variable PRESSMARK_ADMIN_TOKEN to enable them");
        }
        if (!presented(ctx).map(admin.get()::matches).orElse(false)) {
            throw ApiProblem.unauthorized("this endpoint needs the admin token as \"Authorization: Bearer <token>\"");
        }
    }

    /** A reading endpoint: the reader token, or the admin token, which may do everything. */
    void requireReader(Context ctx) {
        if (!mayRead(ctx)) {
            throw ApiProblem.unauthorized("this endpoint needs the reader token as \"Authorization: Bearer <token>\"");
        }
    }

    /** Whether the request may read: no reader token is set, or it presents the reader or the admin token. */
    boolean mayRead(Context ctx) {
        if (reader.isEmpty()) {
            return true;
        }
        Optional<String> token = presented(ctx);
        return token.map(reader.get()::matches).orElse(false)
                || token.map(t -> admin.map(a -> a.matches(t)).orElse(false)).orElse(false);
    }

    private static Optional<String> presented(Context ctx) {
        String header = ctx.header("Authorization");
        if (header == null || !header.regionMatches(true, 0, BEARER, 0, BEARER.length())) {
            return Optional.empty();
        }
        return Optional.of(header.substring(BEARER.length()).strip());
    }
}
