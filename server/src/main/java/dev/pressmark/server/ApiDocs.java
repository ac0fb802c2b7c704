package dev.pressmark.server;

import dev.pressmark.openapi.ApiDocument;
import dev.pressmark.openapi.Descriptors;
import dev.pressmark.openapi.ModelDescriptor;
import dev.pressmark.openapi.ServiceInfo;
import io.javalin.http.Context;
import io.swagger.v3.oas.models.OpenAPI;
import java.io.IOException;
import java.io.InputStream;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Properties;
import java.util.concurrent.atomic.AtomicReference;

/**
 * {@code /openapi.json}, {@code /openapi.yaml} and the browsable {@code /docs}. The document
 * describes the versions being served, so it is built again whenever one of them changes; the
 * page and its assets come from the classpath, nothing from elsewhere.
 */
final class ApiDocs {

    static final String YAML = "application/yaml";
    static final String ASSETS = "/docs/assets/";
    /** Our own script, served beside the renderer's files. */
    static final String INITIALIZER = "pressmark-docs.js";
    private static final String OWN = "/dev/pressmark/server/docs/";
    private static final String WEBJAR_PROPERTIES = "/META-INF/maven/org.webjars/swagger-ui/pom.properties";
    /** The renderer's files the page uses or may ask for; nothing else of the webjar is served. */
    private static final List<String> RENDERER_FILES = List.of("swagger-ui.css", "swagger-ui-bundle.js", "favicon-32x32.png",
            "favicon-16x16.png", "swagger-ui-bundle.js.LICENSE.txt");
    private static final long ASSET_MAX_AGE_SECONDS = 3_600;

    /** A built document and the served versions it describes. */
    private record Built(List<String> key, String json, String yaml) {
    }

    private final LiveModels live;
    private final Access access;
    private final ServiceInfo service;
    private final String rendererDirectory;
    private final AtomicReference<Built> built = new AtomicReference<>();

    ApiDocs(LiveModels live, ServerConfig config, Access access) {
        this.live = live;
        this.access = access;
        this.service = new ServiceInfo(programVersion(), config.security().readerToken().isPresent());
        this.rendererDirectory = "/META-INF/resources/webjars/swagger-ui/" + rendererVersion() + "/";
    }

    /** The jar's version; "development" when run from classes. */
    static String programVersion() {
        String version = ApiDocs.class.getPackage().getImplementationVersion();
        return version == null ? "development" : version;
    }

    private static String rendererVersion() {
        try (InputStream in = ApiDocs.class.getResourceAsStream(WEBJAR_PROPERTIES)) {
            if (in == null) {
                throw new IllegalStateException("the documentation renderer is not on the classpath (" + WEBJAR_PROPERTIES + ")");
            }
            Properties properties = new Properties();
            properties.load(in);
            return properties.getProperty("version");
        } catch (IOException e) {
            throw new UncheckedIOException("reading " + WEBJAR_PROPERTIES + " failed", e);
        }
    }

    /** The document names the models, their labels and input fields: with a reader token set, it is for readers. */
    void json(Context ctx) {
        access.requireReader(ctx);
        ctx.contentType(Requests.JSON).result(current().json().getBytes(StandardCharsets.UTF_8));
    }

    void yaml(Context ctx) {
        access.requireReader(ctx);
        // as bytes: labels and field names may be any text, and a String would go out in ISO-8859-1 for this type
        ctx.contentType(YAML).result(current().yaml().getBytes(StandardCharsets.UTF_8));
    }

    void page(Context ctx) {
        ctx.contentType("text/html; charset=utf-8").result(resource(OWN + "index.html", "index.html"));
    }

    void asset(Context ctx) {
        String file = ctx.pathParam("file");
        String path;
        if (file.equals(INITIALIZER)) {
            path = OWN + INITIALIZER;
        } else if (RENDERER_FILES.contains(file)) {
            path = rendererDirectory + file;
        } else {
            throw ApiProblem.notFound("no-such-asset", "no documentation asset " + file);
        }
        ctx.header("Cache-Control", "public, max-age=" + ASSET_MAX_AGE_SECONDS);
        ctx.header("X-Content-Type-Options", "nosniff");
        ctx.contentType(contentType(file)).result(resource(path, file));
    }

    private static String contentType(String file) {
        if (file.endsWith(".css")) {
            return "text/css; charset=utf-8";
        }
        if (file.endsWith(".js")) {
            return "text/javascript; charset=utf-8";
        }
        if (file.endsWith(".png")) {
            return "image/png";
        }
        return "text/plain; charset=utf-8";
    }

    private static byte[] resource(String path, String name) {
        try (InputStream in = ApiDocs.class.getResourceAsStream(path)) {
            if (in == null) {
                throw new IllegalStateException("documentation file " + name + " is missing from the classpath (" + path + ")");
            }
            return in.readAllBytes();
        } catch (IOException e) {
            throw new UncheckedIOException("reading " + path + " failed", e);
        }
    }

    /** The document of the versions served now: the one built before if they have not changed since. */
    private Built current() {
        Map<String, LiveVersion> serving = live.serving();
        List<String> key = new ArrayList<>(serving.size());
        serving.forEach((model, version) -> key.add(model + " " + version.tag() + " " + version.sha256()));
        Built last = built.get();
        if (last != null && last.key().equals(key)) {
            return last;
        }
        List<ModelDescriptor> models = new ArrayList<>(serving.size());
        serving.forEach((model, version) -> models.add(Descriptors.of(model, version.tag(), version.bundle(),
                version.version().contract().map(c -> c.version().toString()).orElse(ModelDescriptor.FIRST_CONTRACT_VERSION))));
        OpenAPI api = ApiDocument.build(service, models);
        Built fresh = new Built(List.copyOf(key), ApiDocument.json(api), ApiDocument.yaml(api));
        built.set(fresh);
        return fresh;
    }
}
