package dev.pressmark.openapi;

import com.fasterxml.jackson.core.JsonProcessingException;
import dev.pressmark.core.contract.SemanticVersion;
import io.swagger.v3.core.util.Json31;
import io.swagger.v3.core.util.Yaml31;
import io.swagger.v3.oas.models.Components;
import io.swagger.v3.oas.models.OpenAPI;
import io.swagger.v3.oas.models.Paths;
import io.swagger.v3.oas.models.SpecVersion;
import io.swagger.v3.oas.models.info.Contact;
import io.swagger.v3.oas.models.info.Info;
import io.swagger.v3.oas.models.servers.Server;
import io.swagger.v3.oas.models.tags.Tag;
import java.io.UncheckedIOException;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.HashSet;
import java.util.List;
import java.util.Objects;
import java.util.Set;

/**
 * The OpenAPI 3.1 document of the HTTP service: every endpoint, plus for each served model its
 * own predict and explain paths whose schemas name that model's input fields and labels.
 *
 * <p>The document's {@code info.version} follows the contracts of the served models: with one
 * model it is that model's contract version; with several it is the component-wise sum of their
 * contract versions (majors summed, minors summed, patches summed), so a breaking change to any
 * model raises the major and an added label anywhere raises the minor. With no model served it is
 * the program's version. The description lists each model's contract version.
 */
public final class ApiDocument {

    public static final String OPENAPI_VERSION = "3.1.0";
    /** The request header that carries a bundle's signature file, base64url-encoded, on publish. */
    public static final String SIGNATURE_HEADER = "Pressmark-Signature";

    private ApiDocument() {
    }

    /** The document for a service serving {@code models} (any order; the document lists them by name). */
    public static OpenAPI build(ServiceInfo service, List<ModelDescriptor> models) {
        Objects.requireNonNull(service, "service");
        List<ModelDescriptor> sorted = new ArrayList<>(models);
        sorted.sort(Comparator.comparing(ModelDescriptor::name));
        Set<String> names = new HashSet<>();
        for (ModelDescriptor model : sorted) {
            if (!names.add(model.name())) {
                throw new IllegalArgumentException("models must have distinct names, " + model.name() + " came twice");
            }
        }
        OpenAPI api = new OpenAPI(SpecVersion.V31);
        api.setOpenapi(OPENAPI_VERSION);
        api.setInfo(info(service, sorted));
        api.setServers(new ArrayList<>(List.of(new Server().url("/").description("This server."))));
        api.setTags(tags(sorted));
        Components components = new Components();
        Shapes.addTo(components);
        Ops.addTo(components);
        Paths paths = new Paths();
        new ServicePaths(service.readerTokenRequired()).addTo(paths);
        for (ModelDescriptor model : sorted) {
            new ModelPaths(model, service.readerTokenRequired()).addTo(components, paths);
        }
        api.setComponents(components);
        api.setPaths(paths);
        return api;
    }

    public static String json(OpenAPI api) {
        try {
            return Json31.mapper().writerWithDefaultPrettyPrinter().writeValueAsString(api);
        } catch (JsonProcessingException e) {
            throw new UncheckedIOException("the document cannot be written as JSON", e);
        }
    }

    public static String yaml(OpenAPI api) {
        try {
            return Yaml31.mapper().writeValueAsString(api);
        } catch (JsonProcessingException e) {
            throw new UncheckedIOException("the document cannot be written as YAML", e);
        }
    }

    private static Info info(ServiceInfo service, List<ModelDescriptor> models) {
        StringBuilder description = new StringBuilder("Short-text classifiers served from a versioned store. "
                + "Errors are RFC 9457 problem details (application/problem+json). ");
        if (models.isEmpty()) {
            description.append("No model is being served.");
        } else {
            description.append("Models served: ");
            for (int i = 0; i < models.size(); i++) {
                description.append(i == 0 ? "" : ", ").append(models.get(i).name()).append(' ').append(models.get(i).activeTag())
                        .append(" (contract ").append(models.get(i).contractVersion()).append(')');
            }
            description.append('.');
        }
        Info info = new Info();
        info.setTitle("pressmark");
        info.setVersion(documentVersion(service, models));
        info.setDescription(description.toString());
        Contact contact = new Contact();
        contact.setName("pressmark");
        info.setContact(contact);
        return info;
    }

    /** The rule of the class comment: the program's version without models, else the sum of the contract versions. */
    static String documentVersion(ServiceInfo service, List<ModelDescriptor> models) {
        if (models.isEmpty()) {
            return service.version();
        }
        int major = 0;
        int minor = 0;
        int patch = 0;
        for (ModelDescriptor model : models) {
            SemanticVersion v = SemanticVersion.parse(model.contractVersion());
            major = Math.addExact(major, v.major());
            minor = Math.addExact(minor, v.minor());
            patch = Math.addExact(patch, v.patch());
        }
        return new SemanticVersion(major, minor, patch).toString();
    }

    private static List<Tag> tags(List<ModelDescriptor> models) {
        List<Tag> tags = new ArrayList<>();
        tags.add(tag(ServicePaths.HEALTH, "Liveness and readiness."));
        tags.add(tag(ServicePaths.MODELS, "Models and their versions."));
        tags.add(tag(ServicePaths.PREDICT, "Predict and explain with any model; the model-NAME tags type each served model's fields and labels."));
        tags.add(tag(ServicePaths.ADMIN, "Publish, activate, roll back and retire; needs the admin token."));
        tags.add(tag(ServicePaths.DOCS, "This document and its browsable rendering."));
        tags.add(tag(ServicePaths.METRICS, "Service metrics."));
        for (ModelDescriptor model : models) {
            tags.add(new ModelPaths(model, false).tag());
        }
        return tags;
    }

    private static Tag tag(String name, String description) {
        Tag tag = new Tag();
        tag.setName(name);
        tag.setDescription(description);
        return tag;
    }
}
