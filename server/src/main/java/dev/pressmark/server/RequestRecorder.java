package dev.pressmark.server;

import io.javalin.http.Context;
import io.javalin.http.HandlerType;
import io.javalin.http.RequestLogger;
import java.util.function.Predicate;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

/**
 * Runs once for every answered request, failures included: records it in the {@link Metrics}
 * and, when enabled, writes its {@link AccessLog} line. Handlers tell it what they served
 * through request attributes.
 */
final class RequestRecorder implements RequestLogger {

    /** The tag of the version that served a predict or explain request. */
    static final String VERSION = "pressmark.version";
    /** How many items a predict or explain request carried. */
    static final String ITEMS = "pressmark.items";

    private static final Logger ACCESS = LoggerFactory.getLogger(AccessLog.LOGGER);
    private static final double NANOS_PER_MS = 1e6;

    private final Metrics metrics;
    private final Predicate<String> served;
    private final boolean accessLog;

    /**
     * @param served whether a model name is one being served; a failed request's model label
     *     is kept only for those, so that requests naming made-up models add no series
     */
    RequestRecorder(Metrics metrics, Predicate<String> served, boolean accessLog) {
        this.metrics = metrics;
        this.served = served;
        this.accessLog = accessLog;
    }

    @Override
    public void handle(Context ctx, Float ms) {
        int status = ctx.statusCode();
        String route = route(ctx);
        String name = ctx.pathParamMap().get("name");
        String model = name != null && (status < 400 || served.test(name)) ? name : "";
        String version = ctx.attribute(VERSION) instanceof String tag ? tag : "";
        String method = ctx.method().name();
        metrics.request(method, route, model, version, status, (long) (ms * NANOS_PER_MS));
        if (accessLog && ACCESS.isInfoEnabled()) {
            int items = ctx.attribute(ITEMS) instanceof Integer n ? n : -1;
            ACCESS.info(AccessLog.line(method, ctx.path(), status, ms, model, version, items));
        }
    }

    /** The matched route's template; never the raw path, whose values are unbounded. */
    private static String route(Context ctx) {
        // When no endpoint matched, the context never left its first phase and has no endpoint path.
        if (ctx.handlerType() == HandlerType.BEFORE) {
            return Metrics.UNMATCHED;
        }
        String template = ctx.endpointHandlerPath();
        return template == null || template.isEmpty() ? Metrics.UNMATCHED : template;
    }
}
