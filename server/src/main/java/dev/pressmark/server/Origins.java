package dev.pressmark.server;

import io.javalin.http.Context;
import io.javalin.http.HttpStatus;
import java.util.List;
import java.util.Locale;
import java.util.Set;

/**
 * With CORS on, a request that says it comes from a page of another origin than the named ones
 * (its {@code Origin} header) is refused with 403 before any handler runs, so that it changes
 * nothing: a browser would hide the answer from that page, but the action would have been done.
 * A request without {@code Origin} (any client but a browser) and one from the service's own
 * origin (the console) pass.
 */
final class Origins {

    private final Set<String> allowed;

    Origins(List<String> allowed) {
        this.allowed = Set.copyOf(allowed);
    }

    void check(Context ctx) {
        String origin = ctx.header("Origin");
        if (origin == null || allowed.contains(origin)) {
            return;
        }
        if (sameOrigin(origin, ctx.header("Host"))) {
            // the CORS plugin marked it 400 as a foreign origin; it is the service's own, so the endpoint answers as usual
            ctx.status(HttpStatus.OK);
            return;
        }
        throw ApiProblem.forbidden("origin-not-allowed", "requests from pages of origin " + Problems.quote(origin)
                + " are not allowed; the server accepts those of " + String.join(", ", allowed.stream().sorted().toList())
                + " (--cors-origin)");
    }

    /** Whether {@code origin} names the host and port the request was sent to. */
    private static boolean sameOrigin(String origin, String host) {
        if (host == null) {
            return false;
        }
        String lower = origin.toLowerCase(Locale.ROOT);
        String authority = lower.startsWith("http://") ? lower.substring(7) : lower.startsWith("https://") ? lower.substring(8) : null;
        return authority != null && authority.equals(host.toLowerCase(Locale.ROOT));
    }
}
