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
import dev.pressmark.store.lifecycle.Promotion;
import dev.pressmark.store.lifecycle.PromotionPolicy;
import dev.pressmark.store.lifecycle.ShadowStatus;
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
    /** Items scored between two looks at the request's deadline: small enough to stop soon, large enough to cost nothing. */
    static final int DEADLINE_BATCH = 256;

    private final BundleStore store;
    private final LiveModels live;
    private final Requests requests;
    private final Views views;
    private final Access access;
    private final Metrics metrics;
    private final long requestTimeoutMs;
    private final TrafficTap tap;
    private final ShadowScoring shadows;
    private final PromotionPolicy promotion;
    private final DriftWatch drift;
    private final Supervisor supervisor;

    ModelRoutes(BundleStore store, LiveModels live, Requests requests, Views views, Access access, Metrics metrics, long requestTimeoutMs,
            TrafficTap tap, ShadowScoring shadows, PromotionPolicy promotion, DriftWatch drift, Supervisor supervisor) {
        this.supervisor = supervisor;
        this.requestTimeoutMs = requestTimeoutMs;
        this.store = store;
        this.live = live;
        this.requests = requests;
        this.views = views;
        this.access = access;
        this.metrics = metrics;
        this.tap = tap;
        this.shadows = shadows;
        this.promotion = promotion;
        this.drift = drift;
    }

    void health(Context ctx) {
        ctx.json(views.object().put("status", "up"));
    }

    void ready(Context ctx) {
        LiveModels.Readiness readiness = live.readiness();
        Map<String, String> down = supervisor.down();
        boolean ready = readiness.ready() && down.isEmpty();
        ObjectNode body = views.object().put("status", ready ? "ready" : "not-ready");
        if (!access.mayRead(ctx)) {
            // a probe needs the status only; which models, versions and failures are there is for readers
            ctx.status(ready ? 200 : 503).json(body);
            return;
        }
        body.put("store", readiness.storeProblem().map(p -> "down: " + p).orElse("up"));
        ObjectNode models = body.putObject("models");
        readiness.active().forEach((model, tag) -> models.putObject(model).put("active", tag));
        readiness.serving().forEach((model, tag) -> entry(models, model).put("serving", tag));
        readiness.failures().forEach((model, failure) -> entry(models, model)
                .put("failed_tag", failure.tag()).put("error", failure.message()));
        if (!down.isEmpty()) {
            // a background loop that keeps failing: drift watch, shadow scoring or the change feed does not work here
            ObjectNode background = body.putObject("background");
            down.forEach(background::put);
        }
        ctx.status(ready ? 200 : 503).json(body);
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
        Deadline deadline = Deadline.start(requestTimeoutMs);
        access.requireReader(ctx);
        String name = ctx.pathParam("name");
        predict(ctx, name, activeLive(name), deadline, true);
    }

    void predictNamed(Context ctx) throws IOException {
        Deadline deadline = Deadline.start(requestTimeoutMs);
        access.requireReader(ctx);
        String name = ctx.pathParam("name");
        String tag = ctx.pathParam("tag");
        storedVersion(name, tag);
        predict(ctx, name, live.named(name, tag), deadline, false);
    }

    /** Answers a predict request; one the active version answered goes to the traffic tap too, when a listener wants the model. */
    private void predict(Context ctx, String name, LiveVersion served, Deadline deadline, boolean tapped) throws IOException {
        ctx.attribute(RequestRecorder.VERSION, served.tag());
        ItemsReader.Items read = requests.items(ctx, served.bundle().inputFields(), deadline);
        List<Map<String, String>> items = read.list();
        ctx.attribute(RequestRecorder.ITEMS, items.size());
        // each item is scored on its own, so scoring in batches gives the same predictions and a place to stop
        List<Prediction> predictions = new ArrayList<>(items.size());
        for (int from = 0; from < items.size(); from += DEADLINE_BATCH) {
            deadline.check();
            predictions.addAll(served.bundle().predict(items.subList(from, Math.min(items.size(), from + DEADLINE_BATCH)),
                    requests.maxTokensPerField()));
        }
        deadline.check();
        if (read.cutWords() != null) {
            for (int i = 0; i < predictions.size(); i++) {
                predictions.set(i, withCut(predictions.get(i), read.cutWords(i)));
            }
        }
        metrics.predictions(name, served.tag(), predictions);
        answer(ctx, views.predictions(name, served, predictions));
        if (tapped && tap.wants(name)) {
            tap.offer(name, served.tag(), served.bundle(), items, predictions);
        }
    }

    /** A prediction whose text was also cut while it was read, by {@code cutWords} words (each at least a token). */
    private static Prediction withCut(Prediction p, int cutWords) {
        return cutWords == 0 ? p : new Prediction(p.label(), p.score(), p.probabilities(), p.unknownTokens(), p.truncatedTokens() + cutWords);
    }

    void drift(Context ctx) {
        access.requireReader(ctx);
        String name = ctx.pathParam("name");
        LiveVersion served = activeLive(name);
        ctx.json(views.drift(name, served.tag(), drift.report(name, served)));
    }

    void explain(Context ctx) throws IOException {
        Deadline deadline = Deadline.start(requestTimeoutMs);
        access.requireReader(ctx);
        String name = ctx.pathParam("name");
        int k = Requests.intQuery(ctx, "k", DEFAULT_K, 0, MAX_K);
        LiveVersion served = activeLive(name);
        ctx.attribute(RequestRecorder.VERSION, served.tag());
        Bundle bundle = served.bundle();
        ItemsReader.Items read = requests.items(ctx, bundle.inputFields(), deadline);
        List<Map<String, String>> items = read.list();
        ctx.attribute(RequestRecorder.ITEMS, items.size());
        List<Explanation> explanations = new ArrayList<>(items.size());
        for (int i = 0; i < items.size(); i++) {
            deadline.check();
            Explanation e = bundle.explain(items.get(i), k, requests.maxTokensPerField());
            int cut = read.cutWords(i);
            explanations.add(cut == 0 ? e : new Explanation(withCut(e.prediction(), cut), e.intercept(), e.contributions(), e.featuresUsed()));
        }
        answer(ctx, views.explanations(name, served, explanations));
    }

    /**
     * Writes an answer already rendered to bytes straight to the response. Javalin would wrap them in
     * a stream and copy that through a fresh 8 KiB buffer, which costs a one-item predict more than its
     * model does; the response stream still compresses a large answer for a client that accepts it.
     */
    private static void answer(Context ctx, byte[] json) throws IOException {
        ctx.contentType(Requests.JSON);
        ctx.outputStream().write(json);
    }

    void publish(Context ctx) {
        access.requireAdmin(ctx);
        String name = ctx.pathParam("name");
        String tag = ctx.pathParam("tag");
        PublishOptions options = new PublishOptions(Requests.signatureHeader(ctx), Requests.booleanQuery(ctx, "allow_breaking"));
        Version version = store.publish(name, tag, requests.bundleBody(ctx), options, ACTOR);
        ctx.status(201).header("Location", "/models/" + name + "/versions/" + tag).json(views.versionDetail(version));
    }

    /**
     * Activates a version through the one activation rule ({@link Promotion}): the promotion check
     * against the active version, loading it here, and a compare-and-set on the active tag. A
     * refusal is a 409 whose {@code checks} member lists each failed check, unless the body says
     * {@code "force": true} with a {@code reason}, which then goes into the events with the failed
     * checks.
     */
    void activate(Context ctx) throws IOException {
        access.requireAdmin(ctx);
        String name = ctx.pathParam("name");
        Requests.ActivateBody body = Requests.activateBody(requests.jsonBody(ctx));
        storedVersion(name, body.tag());
        String reason = body.force() || !body.reason().isEmpty() ? body.reason() : "activated over HTTP";
        Promotion.Result result;
        try {
            result = Promotion.activate(store, new Promotion.Request(name, body.tag(), body.force(), reason, promotion, ACTOR),
                    shadows.status(name, Optional.of(body.tag())).map(ShadowStatus::summary));
        } catch (Promotion.Refused e) {
            throw ApiProblem.conflict(Promotion.Refused.CODE, "Promotion check failed", e.outcome().describe()
                    + "; send \"force\": true with a \"reason\" to activate anyway").withMembers(views.promotion(e.outcome()));
        }
        shadows.sync();
        ObjectNode answer = answerActivation(name, result.activation());
        answer.set("promotion_check", views.promotion(result.outcome()).put("forced", body.force()));
        ctx.json(answer);
    }

    void startShadow(Context ctx) throws IOException {
        access.requireAdmin(ctx);
        String name = ctx.pathParam("name");
        Requests.ShadowBody body = Requests.shadowBody(requests.jsonBody(ctx));
        store.startShadow(name, body.tag(), body.fraction(), ACTOR);
        shadows.sync();
        ctx.json(shadowStatus(name));
    }

    void shadow(Context ctx) {
        access.requireReader(ctx);
        ctx.json(shadowStatus(ctx.pathParam("name")));
    }

    void stopShadow(Context ctx) {
        access.requireAdmin(ctx);
        String name = ctx.pathParam("name");
        if (store.stopShadow(name, ACTOR, "stopped over HTTP").isEmpty()) {
            throw noShadow(name);
        }
        // writes this server's final snapshot before the answer reads the reports back
        shadows.sync();
        ctx.json(shadowStatus(name));
    }

    private ObjectNode shadowStatus(String name) {
        store.versions(name); // a 404 for an unknown model
        return Views.shadowStatus(shadows.status(name, Optional.empty()).orElseThrow(() -> noShadow(name)));
    }

    private static ApiProblem noShadow(String name) {
        return ApiProblem.notFound("no-shadow", "model " + name + " has no shadow running and no shadow report");
    }

    void rollback(Context ctx) {
        access.requireAdmin(ctx);
        String name = ctx.pathParam("name");
        // never checked: rolling back is the way out of an emergency
        ObjectNode answer = answerActivation(name, store.rollback(name, ACTOR));
        shadows.sync();
        ctx.json(answer);
    }

    /**
     * Retires a version through the store's one rule for it: 409 {@code version-active} for the
     * active version, {@code already-retired} for a retired one; the reason goes into the events.
     */
    void retire(Context ctx) throws IOException {
        access.requireAdmin(ctx);
        String reason = Requests.retireReason(requests.jsonBody(ctx));
        Version retired = store.retire(ctx.pathParam("name"), ctx.pathParam("tag"), ACTOR, reason);
        // a shadow of the version has stopped in the store; this server stops scoring it now rather than on its next look
        shadows.sync();
        ctx.json(views.versionDetail(retired));
    }

    /** Loads the newly active version now rather than waiting for the change feed, and says which version serves. */
    private ObjectNode answerActivation(String name, Activation activation) {
        live.refresh(name);
        ObjectNode body = views.versionDetail(storedVersion(name, activation.tag()));
        body.put("serving", live.active(name).map(LiveVersion::tag).orElse(null));
        return body;
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
