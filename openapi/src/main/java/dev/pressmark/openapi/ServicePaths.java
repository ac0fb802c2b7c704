package dev.pressmark.openapi;

import static dev.pressmark.openapi.Ops.json;
import static dev.pressmark.openapi.Ops.operation;
import static dev.pressmark.openapi.Ops.problems;
import static dev.pressmark.openapi.Schemas.ref;

import io.swagger.v3.oas.models.Operation;
import io.swagger.v3.oas.models.PathItem;
import io.swagger.v3.oas.models.Paths;
import io.swagger.v3.oas.models.headers.Header;
import io.swagger.v3.oas.models.media.Content;
import io.swagger.v3.oas.models.media.JsonSchema;
import io.swagger.v3.oas.models.parameters.Parameter;
import io.swagger.v3.oas.models.parameters.RequestBody;
import io.swagger.v3.oas.models.responses.ApiResponse;
import java.math.BigDecimal;
import java.util.ArrayList;
import java.util.List;

/** The paths that are the same whatever models are served: health, metadata, admin, the templated predict and explain, docs. */
final class ServicePaths {

    static final String HEALTH = "health";
    static final String MODELS = "models";
    static final String PREDICT = "predict";
    static final String ADMIN = "admin";
    static final String DOCS = "docs";
    static final String METRICS = "metrics";
    static final String SIGNATURE_HEADER = ApiDocument.SIGNATURE_HEADER;

    private final boolean readerToken;

    ServicePaths(boolean readerToken) {
        this.readerToken = readerToken;
    }

    static Parameter name() {
        return Ops.pathParameter("name", "The model's name.", Shapes.NAME_PATTERN);
    }

    static Parameter tag() {
        return Ops.pathParameter("tag", "A version's tag.", Shapes.TAG_PATTERN);
    }

    /** A reading operation: open, or behind the reader token when the server has one. */
    Operation reading(Operation operation) {
        if (readerToken) {
            Ops.secured(operation);
        }
        return operation;
    }

    /** An admin operation: always behind the admin token, and 403 while the server has none. */
    static Operation admin(Operation operation) {
        Ops.secured(operation);
        problems(operation, 403);
        return operation;
    }

    void addTo(Paths paths) {
        Operation health = operation("getHealth", HEALTH, "Liveness", "Answers while the process runs; touches neither the store nor the models.");
        health.getResponses().addApiResponse("200", json("The process is up.", ref(Shapes.HEALTH)));
        paths.addPathItem("/health", new PathItem().get(health));

        Operation ready = operation("getReadiness", HEALTH, "Readiness",
                "200 when the store answers and every active model is loaded, else 503; both name each model's active and served tags.");
        ready.getResponses().addApiResponse("200", json("Ready to serve.", ref(Shapes.READINESS)));
        ready.getResponses().addApiResponse("503", json("Not ready: the store is down or a model is not loaded.", ref(Shapes.READINESS)));
        paths.addPathItem("/health/ready", new PathItem().get(ready));

        Operation models = reading(operation("listModels", MODELS, "List the models", "Every model in the store with its active version."));
        models.getResponses().addApiResponse("200", json("The models, by name.", ref(Shapes.MODEL_LIST)));
        problems(models, 500, 503);
        paths.addPathItem("/models", new PathItem().get(models));

        Operation model = reading(operation("getModel", MODELS, "Describe a model's active version",
                "Labels, input fields, metrics, checksum and creation time of the version being served."));
        model.getResponses().addApiResponse("200", json("The active version.", ref(Shapes.VERSION_DETAIL)));
        problems(model, 400, 404, 500, 503);
        paths.addPathItem("/models/{name}", new PathItem().get(model).parameters(new ArrayList<>(List.of(name()))));

        Operation versions = reading(operation("listVersions", MODELS, "List a model's versions", "Every version, newest first."));
        versions.getResponses().addApiResponse("200", json("The versions.", ref(Shapes.VERSION_LIST)));
        problems(versions, 400, 404, 500, 503);
        paths.addPathItem("/models/{name}/versions", new PathItem().get(versions).parameters(new ArrayList<>(List.of(name()))));

        Operation version = reading(operation("getVersion", MODELS, "Describe one version", "A version's metadata, active or not."));
        version.getResponses().addApiResponse("200", json("The version.", ref(Shapes.VERSION_DETAIL)));
        problems(version, 400, 404, 500, 503);
        paths.addPathItem("/models/{name}/versions/{tag}", new PathItem().get(version).put(publish())
                .parameters(new ArrayList<>(List.of(name(), tag()))));

        Operation drift = reading(operation("getDrift", MODELS, "Compare live traffic with the training rows",
                "A sampled window of the active version's predict items against its training profile: unknown-token rate, "
                        + "population stability index over the most frequent tokens, and tokens per item. The window starts empty "
                        + "when another version becomes active."));
        drift.getResponses().addApiResponse("200", json("The window against the profile.", ref(Shapes.DRIFT_REPORT)));
        problems(drift, 400, 404, 500, 503);
        paths.addPathItem("/models/{name}/drift", new PathItem().get(drift).parameters(new ArrayList<>(List.of(name()))));

        addPredictions(paths);
        addAdmin(paths);
        addShadow(paths);
        addDocs(paths);
    }

    private static Operation publish() {
        Operation publish = admin(operation("publishVersion", ADMIN, "Upload a bundle as a new version",
                "Stores the bundle file under an immutable tag after checking every entry's checksum; does not activate it."
                        + " While the store trusts signing keys, the bundle must carry a signature by one of them (header " + SIGNATURE_HEADER + ")."
                        + " Its input fields and labels are compared with the active version's: removing a field or a label, or adding a field"
                        + " (predict requires every field), breaks the contract and is refused with 409 unless allow_breaking=true; the new"
                        + " version's contract version raises the major for a breaking change, the minor for another change."));
        publish.addParametersItem(signatureHeader());
        publish.addParametersItem(allowBreaking());
        RequestBody body = new RequestBody();
        body.setRequired(true);
        body.setDescription("The bundle file (.pmb) as written by pressmark train.");
        Content content = Ops.content("application/octet-stream", Schemas.typed("string", null));
        content.get("application/octet-stream").getSchema().setContentMediaType("application/octet-stream");
        content.addMediaType("application/zip", Ops.content("application/zip", Schemas.typed("string", null)).get("application/zip"));
        content.get("application/zip").getSchema().setContentMediaType("application/zip");
        body.setContent(content);
        publish.setRequestBody(body);
        ApiResponse created = json("Published.", ref(Shapes.VERSION_DETAIL));
        Header location = new Header();
        location.setDescription("The new version's path.");
        location.setSchema(Schemas.string(null));
        created.addHeaderObject("Location", location);
        publish.getResponses().addApiResponse("201", created);
        problems(publish, 400, 409, 413, 415, 422, 500, 503, 507);
        return publish;
    }

    static Parameter signatureHeader() {
        Parameter header = new Parameter();
        header.setName(SIGNATURE_HEADER);
        header.setIn("header");
        header.setRequired(false);
        header.setDescription("The bundle's signature file (pressmark sign writes BUNDLE.sig), base64url-encoded (RFC 4648 section 5, padding"
                + " optional): JSON {\"format\":1,\"algorithm\":\"Ed25519\",\"key_id\":...,\"sha256\":...,\"signature\":...}.");
        header.setSchema(Schemas.pattern(Schemas.string(null), "^[A-Za-z0-9_-]+=*$"));
        return header;
    }

    static Parameter allowBreaking() {
        Parameter allow = new Parameter();
        allow.setName("allow_breaking");
        allow.setIn("query");
        allow.setRequired(false);
        allow.setDescription("Publish even if the bundle breaks the active version's contract; its contract version then raises the major.");
        JsonSchema schema = Schemas.bool(null);
        schema.setDefault(false);
        allow.setSchema(schema);
        return allow;
    }

    private void addPredictions(Paths paths) {
        Operation predict = reading(operation("predict", PREDICT, "Predict with a model's active version",
                "Items must carry every input field of the model; the model-specific paths below spell them out."));
        predict.setRequestBody(jsonBody(Shapes.PREDICT_REQUEST));
        predict.getResponses().addApiResponse("200", json("One prediction per item.", ref(Shapes.PREDICT_RESPONSE)));
        problems(predict, 400, 404, 413, 415, 500, 503);
        paths.addPathItem("/models/{name}/predict", new PathItem().post(predict).parameters(new ArrayList<>(List.of(name()))));

        Operation named = reading(operation("predictVersion", PREDICT, "Predict with a named version",
                "As predict, with the version of that tag, active or not."));
        named.setRequestBody(jsonBody(Shapes.PREDICT_REQUEST));
        named.getResponses().addApiResponse("200", json("One prediction per item.", ref(Shapes.PREDICT_RESPONSE)));
        problems(named, 400, 404, 409, 413, 415, 500, 503);
        paths.addPathItem("/models/{name}/versions/{tag}/predict", new PathItem().post(named)
                .parameters(new ArrayList<>(List.of(name(), tag()))));

        Operation explain = reading(operation("explain", PREDICT, "Explain predictions of a model's active version",
                "Each item's prediction with the k subword features that moved its score most."));
        explain.setRequestBody(jsonBody(Shapes.PREDICT_REQUEST));
        explain.addParametersItem(k());
        explain.getResponses().addApiResponse("200", json("One explanation per item.", ref(Shapes.EXPLAIN_RESPONSE)));
        problems(explain, 400, 404, 413, 415, 500, 503);
        paths.addPathItem("/models/{name}/explain", new PathItem().post(explain).parameters(new ArrayList<>(List.of(name()))));
    }

    static Parameter k() {
        Parameter k = new Parameter();
        k.setName("k");
        k.setIn("query");
        k.setRequired(false);
        k.setDescription("How many contributions to list per item.");
        JsonSchema schema = Schemas.integer(null, 0);
        schema.setMaximum(BigDecimal.valueOf(1_000));
        schema.setDefault(10);
        k.setSchema(schema);
        return k;
    }

    static RequestBody jsonBody(String component) {
        RequestBody body = new RequestBody();
        body.setRequired(true);
        body.setContent(Ops.content(Ops.JSON, ref(component)));
        return body;
    }

    private static void addAdmin(Paths paths) {
        Operation activate = admin(operation("activateVersion", ADMIN, "Activate a version",
                "Makes a published version the one served after the promotion check against the active one (a 409 whose checks member"
                        + " says why, unless forced with a reason); this server loads it before answering, the others follow the store."));
        activate.setRequestBody(jsonBody(Shapes.ACTIVATE_REQUEST));
        activate.getResponses().addApiResponse("200", json("Activated.", ref(Shapes.ACTIVATION)));
        problems(activate, 400, 404, 409, 415, 500, 503);
        paths.addPathItem("/models/{name}/active", new PathItem().put(activate).parameters(new ArrayList<>(List.of(name()))));

        Operation rollback = admin(operation("rollback", ADMIN, "Roll back",
                "Re-activates the version that was active before the current one; never held back by the promotion check."));
        rollback.getResponses().addApiResponse("200", json("Rolled back.", ref(Shapes.ACTIVATION)));
        problems(rollback, 400, 404, 409, 500, 503);
        paths.addPathItem("/models/{name}/rollback", new PathItem().post(rollback).parameters(new ArrayList<>(List.of(name()))));

        Operation retire = admin(operation("retireVersion", ADMIN, "Retire a version",
                "Marks a version retired with a reason, which goes into the events: it stays listed, readable and loadable by tag, but can"
                        + " no longer be activated, rolled back to or shadowed (409 version-retired); a shadow of it stops. The active version"
                        + " is refused (409 version-active), and so is a version retired already (409 already-retired)."));
        retire.setRequestBody(jsonBody(Shapes.RETIRE_REQUEST));
        retire.getResponses().addApiResponse("200", json("Retired; the version as it is now.", ref(Shapes.VERSION_DETAIL)));
        problems(retire, 400, 404, 409, 415, 500, 503);
        paths.addPathItem("/models/{name}/versions/{tag}/retire", new PathItem().post(retire)
                .parameters(new ArrayList<>(List.of(name(), tag()))));
    }

    private void addShadow(Paths paths) {
        Operation start = admin(operation("startShadow", ADMIN, "Start shadow scoring",
                "Scores the candidate beside the active version on a fraction of the requests the active version answers, off the request path,"
                        + " on every server of the store within about 2 s; the answers stay the active version's. A new start is a new run."));
        start.setRequestBody(jsonBody(Shapes.SHADOW_REQUEST));
        start.getResponses().addApiResponse("200", json("Started; the run's report so far.", ref(Shapes.SHADOW_REPORT)));
        problems(start, 400, 404, 409, 415, 500, 503);

        Operation report = reading(operation("getShadow", MODELS, "Report the shadow run",
                "The model's newest shadow run, running or stopped, every replica's report summed; this server's part is taken now."));
        report.getResponses().addApiResponse("200", json("The run's report.", ref(Shapes.SHADOW_REPORT)));
        problems(report, 400, 404, 500, 503);

        Operation stop = admin(operation("stopShadow", ADMIN, "Stop shadow scoring",
                "Stops the run on every server; answers with its final report. An activation or rollback also stops it."));
        stop.getResponses().addApiResponse("200", json("Stopped; the final report.", ref(Shapes.SHADOW_REPORT)));
        problems(stop, 400, 404, 500, 503);
        paths.addPathItem("/models/{name}/shadow", new PathItem().get(report).put(start).delete(stop).parameters(new ArrayList<>(List.of(name()))));
    }

    private static void addDocs(Paths paths) {
        Operation json = operation("getOpenApiJson", DOCS, "This document as JSON", "The OpenAPI 3.1 document of the models served now.");
        json.getResponses().addApiResponse("200", json("The document.", Schemas.typed("object", null)));
        paths.addPathItem("/openapi.json", new PathItem().get(json));

        Operation yaml = operation("getOpenApiYaml", DOCS, "This document as YAML", "The same document as YAML.");
        yaml.getResponses().addApiResponse("200", Ops.answer("The document.", "application/yaml", Schemas.string(null)));
        paths.addPathItem("/openapi.yaml", new PathItem().get(yaml));

        Operation docs = operation("getDocs", DOCS, "Browsable documentation", "An HTML page that renders this document.");
        docs.getResponses().addApiResponse("200", Ops.answer("The page.", "text/html", Schemas.string(null)));
        paths.addPathItem("/docs", new PathItem().get(docs));

        Operation metrics = operation("getMetrics", METRICS, "Metrics", "Prometheus text exposition of the service's counters and timings.");
        metrics.getResponses().addApiResponse("200", Ops.answer("The metrics.", "text/plain", Schemas.string(null)));
        paths.addPathItem("/metrics", new PathItem().get(metrics));
    }
}
