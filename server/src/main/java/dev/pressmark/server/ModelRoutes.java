package dev.pressmark.server;

import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import dev.pressmark.core.bundle.Bundle;
import dev.pressmark.core.bundle.Explanation;
import dev.pressmark.core.bundle.Prediction;
import dev.pressmark.store.Activation;
import dev.pressmark.store.BundleStore;
import dev.pressmark.store.ModelSummary;
import dev.pressmark.store.PublishOptions;
import dev.pressmark.store.Version;
import io.javalin.http.Context;
import java.io.IOException;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Optional;

/** The endpoint handlers. Each parses, validates, calls the live models or the store, and answers. */
final class ModelRoutes {

    /** What the audit events name as the actor of a change made over HTTP. */
    static final String ACTOR = "http-admin";
    static final int DEFAULT_K = 10;
    static final int MAX_K = 1_000;

    private final BundleStore store;
    private final LiveModels live;
    private final Requests requests;
    private final Views views;
    private final Access access;
    private final Metrics metrics;

    ModelRoutes(BundleStore store, LiveModels live, Requests requests, Views views, Access access, Metrics metrics) {
        this.store = store;
        this.live = live;
        this.requests = requests;
        this.views = views;
        this.access = access;
        this.metrics = metrics;
    }

    void health(Context ctx) {
        ctx.json(views.object().put("status", "up"));
    }

    void ready(Context ctx) {
        LiveModels.Readiness readiness = live.readiness();
        ObjectNode body = views.object().put("status", readiness.ready() ? "ready" : "not-ready");
        body.put("store", readiness.storeProblem().map(p -> "down: " + p).orElse("up"));
        ObjectNode models = body.putObject("models");
        readiness.active().forEach((model, tag) -> models.putObject(model).put("active", tag));
        readiness.serving().forEach((model, tag) -> entry(models, model).put("serving", tag));
        readiness.failures().forEach((model, failure) -> entry(models, model)
                .put("failed_tag", failure.tag()).put("error", failure.message()));
        ctx.status(readiness.ready() ? 200 : 503).json(body);
    }

    private static ObjectNode entry(ObjectNode models, String name) {
        return models.get(name) instanceof ObjectNode existing ? existing : models.putObject(name);
    }

    void models(Context ctx) {
        access.requireReader(ctx);
        ObjectNode body = views.object();
        ArrayNode list = body.putArray("models");
        for (ModelSummary model : store.models()) {
            ObjectNode node = list.addObject().put("name", model.name()).put("versions", model.versionCount());
            Optional<Version> active = model.activeTag().isEmpty() ? Optional.empty() : store.activeVersion(model.name());
            if (active.isPresent()) {
                node.set("active", views.versionSummary(active.get()));
            } else {
                node.putNull("active");
            }
        }
        ctx.json(body);
    }

    void model(Context ctx) {
        access.requireReader(ctx);
        String name = ctx.pathParam("name");
        Version active = store.activeVersion(name).orElseThrow(() -> noActive(name));
        ctx.json(views.versionDetail(active));
    }

    void versions(Context ctx) {
        access.requireReader(ctx);
        String name = ctx.pathParam("name");
        ctx.json(views.versions(name, store.versions(name)));
    }

    void version(Context ctx) {
        access.requireReader(ctx);
        ctx.json(views.versionDetail(storedVersion(ctx.pathParam("name"), ctx.pathParam("tag"))));
    }

    void predictActive(Context ctx) throws IOException {
        access.requireReader(ctx);
        String name = ctx.pathParam("name");
        predict(ctx, name, activeLive(name));
    }

    void predictNamed(Context ctx) throws IOException {
        access.requireReader(ctx);
        String name = ctx.pathParam("name");
        String tag = ctx.pathParam("tag");
        storedVersion(name, tag);
        predict(ctx, name, live.named(name, tag));
    }

    private void predict(Context ctx, String name, LiveVersion served) throws IOException {
        ctx.attribute(RequestRecorder.VERSION, served.tag());
        List<Map<String, String>> items = requests.items(requests.jsonBody(ctx), served.bundle().inputFields());
        ctx.attribute(RequestRecorder.ITEMS, items.size());
        List<Prediction> predictions = served.bundle().predict(items, requests.maxTokensPerField());
        metrics.predictions(name, served.tag(), predictions);
        ctx.contentType(Requests.JSON).result(views.predictions(name, served, predictions));
    }

    void explain(Context ctx) throws IOException {
        access.requireReader(ctx);
        String name = ctx.pathParam("name");
        int k = Requests.intQuery(ctx, "k", DEFAULT_K, 0, MAX_K);
        LiveVersion served = activeLive(name);
        ctx.attribute(RequestRecorder.VERSION, served.tag());
        Bundle bundle = served.bundle();
        List<Map<String, String>> items = requests.items(requests.jsonBody(ctx), bundle.inputFields());
        ctx.attribute(RequestRecorder.ITEMS, items.size());
        List<Explanation> explanations = new ArrayList<>(items.size());
        for (Map<String, String> item : items) {
            explanations.add(bundle.explain(item, k, requests.maxTokensPerField()));
        }
        ctx.contentType(Requests.JSON).result(views.explanations(name, served, explanations));
    }

    void publish(Context ctx) {
        access.requireAdmin(ctx);
        String name = ctx.pathParam("name");
        String tag = ctx.pathParam("tag");
        PublishOptions options = new PublishOptions(Requests.signatureHeader(ctx), Requests.booleanQuery(ctx, "allow_breaking"));
        Version version = store.publish(name, tag, requests.bundleBody(ctx), options, ACTOR);
        ctx.status(201).header("Location", "/models/" + name + "/versions/" + tag).json(views.versionDetail(version));
    }

    void activate(Context ctx) throws IOException {
        access.requireAdmin(ctx);
        String name = ctx.pathParam("name");
        String tag = Requests.requiredString(requests.jsonBody(ctx), "tag");
        Activation activation = store.activate(name, tag, ACTOR, "activated over HTTP");
        answerActivation(ctx, name, activation);
    }

    void rollback(Context ctx) {
        access.requireAdmin(ctx);
        String name = ctx.pathParam("name");
        answerActivation(ctx, name, store.rollback(name, ACTOR));
    }

    /** Loads the newly active version now rather than waiting for the change feed, and says which version serves. */
    private void answerActivation(Context ctx, String name, Activation activation) {
        live.refresh(name);
        ObjectNode body = views.versionDetail(storedVersion(name, activation.tag()));
        body.put("serving", live.active(name).map(LiveVersion::tag).orElse(null));
        ctx.json(body);
    }

    private LiveVersion activeLive(String name) {
        Optional<LiveVersion> serving = live.active(name);
        if (serving.isPresent()) {
            return serving.get();
        }
        // Not loaded yet (published and activated a moment ago, or the model does not exist): ask the store which.
        store.versions(name);
        live.refresh(name);
        return live.active(name).orElseThrow(() -> noActive(name));
    }

    private Version storedVersion(String name, String tag) {
        return store.version(name, tag).orElseThrow(() -> ApiProblem.notFound("no-such-version", "model " + name + " has no version " + tag));
    }

    private static ApiProblem noActive(String name) {
        return ApiProblem.notFound("no-active-version", "model " + name + " has no version being served");
    }
}
