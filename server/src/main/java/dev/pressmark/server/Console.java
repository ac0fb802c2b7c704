package dev.pressmark.server;

import dev.pressmark.core.bundle.Bundle;
import dev.pressmark.core.bundle.HtmlReport;
import dev.pressmark.store.BundleStore;
import io.javalin.Javalin;
import io.javalin.http.Context;
import java.io.IOException;
import java.io.InputStream;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;

/**
 * The web console at {@code GET /}: a server-rendered shell, one script and one stylesheet from
 * the classpath, and the report's charts as SVG. The script reads everything else from the JSON
 * endpoints, with the tokens a person types in, so the console can do no more than its user may.
 * Every response here carries a content security policy that allows only this origin's own
 * script, style and connections, and no inline script or style.
 */
final class Console {

    static final String CONTENT_SECURITY_POLICY = "default-src 'self'; script-src 'self'; style-src 'self'; img-src 'self' data:; "
            + "connect-src 'self'; frame-ancestors 'none'; base-uri 'none'; form-action 'self'";
    static final String SCRIPT_PATH = "/console/app.js";
    static final String STYLE_PATH = "/console/app.css";
    static final String CHARTS_PATH = "/console/models/{name}/versions/{tag}/charts.svg";
    /** How many features per label the console's bars show by default, and at most. */
    static final int DEFAULT_FEATURES = 10;
    static final int MAX_FEATURES = 50;

    private final BundleStore store;
    private final LiveModels live;
    private final Access access;
    private final boolean readerTokenRequired;
    private final byte[] page;
    private final byte[] script;
    private final byte[] style;

    Console(BundleStore store, LiveModels live, Access access, boolean readerTokenRequired) {
        this.store = store;
        this.live = live;
        this.access = access;
        this.readerTokenRequired = readerTokenRequired;
        this.page = resource("index.html");
        this.script = resource("app.js");
        this.style = resource("app.css");
    }

    void register(Javalin app) {
        PressmarkServer.readable(app, "/", this::page);
        PressmarkServer.readable(app, SCRIPT_PATH, ctx -> asset(ctx, script, "text/javascript; charset=utf-8"));
        PressmarkServer.readable(app, STYLE_PATH, ctx -> asset(ctx, style, "text/css; charset=utf-8"));
        PressmarkServer.readable(app, CHARTS_PATH, this::chart);
    }

    private void page(Context ctx) {
        guard(ctx);
        // The shell is fixed text; the only thing it says about this server is whether reading needs a token.
        String html = new String(page, StandardCharsets.UTF_8).replace("{{reader-token}}", readerTokenRequired ? "required" : "open");
        ctx.contentType("text/html; charset=utf-8").result(html);
    }

    private static void asset(Context ctx, byte[] body, String type) {
        guard(ctx);
        ctx.header("Cache-Control", "no-cache").contentType(type).result(body);
    }

    /** {@code ?kind=confusion}, or {@code ?kind=features&label=L[&towards=false][&count=N]}. */
    private void chart(Context ctx) {
        guard(ctx);
        access.requireReader(ctx);
        String name = ctx.pathParam("name");
        String tag = ctx.pathParam("tag");
        store.version(name, tag).orElseThrow(() -> ApiProblem.notFound("no-such-version", "model " + name + " has no version " + tag));
        Bundle bundle = live.named(name, tag).bundle();
        String kind = ctx.queryParam("kind");
        String svg;
        if ("confusion".equals(kind)) {
            svg = HtmlReport.confusionSvg(bundle);
        } else if ("features".equals(kind)) {
            String label = ctx.queryParam("label");
            if (label == null || !bundle.labels().contains(label)) {
                throw ApiProblem.invalidField("label", "must be one of " + String.join(", ", bundle.labels()) + ", was "
                        + (label == null ? "missing" : Problems.quote(label)));
            }
            String towards = ctx.queryParam("towards");
            if (towards != null && !towards.equals("true") && !towards.equals("false")) {
                throw ApiProblem.invalidField("towards", "must be true or false, was " + Problems.quote(towards));
            }
            int count = Requests.intQuery(ctx, "count", DEFAULT_FEATURES, 1, MAX_FEATURES);
            svg = HtmlReport.featureBarsSvg(bundle, label, !"false".equals(towards), count);
        } else {
            throw ApiProblem.invalidField("kind", "must be confusion or features, was " + (kind == null ? "missing" : Problems.quote(kind)));
        }
        ctx.header("Cache-Control", "no-cache").contentType("image/svg+xml; charset=utf-8").result(svg);
    }

    private static void guard(Context ctx) {
        ctx.header("Content-Security-Policy", CONTENT_SECURITY_POLICY);
        ctx.header("X-Content-Type-Options", "nosniff");
        ctx.header("Referrer-Policy", "no-referrer");
    }

    private static byte[] resource(String name) {
        try (InputStream in = Console.class.getResourceAsStream("/console/" + name)) {
            if (in == null) {
                throw new IllegalStateException("the console's " + name + " is missing from the classpath");
            }
            return in.readAllBytes();
        } catch (IOException e) {
            throw new UncheckedIOException("cannot read the console's " + name, e);
        }
    }
}
