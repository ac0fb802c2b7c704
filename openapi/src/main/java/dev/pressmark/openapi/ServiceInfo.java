package dev.pressmark.openapi;

import java.util.Objects;

/**
 * What the document says about the service as a whole.
 *
 * @param version the program's version, the document's {@code info.version} while no model is served
 * @param readerTokenRequired whether the reading endpoints need the reader token (admin ones always need the admin token)
 */
public record ServiceInfo(String version, boolean readerTokenRequired) {

    public ServiceInfo {
        Objects.requireNonNull(version, "version");
        if (version.isBlank()) {
            throw new IllegalArgumentException("version must not be blank, was \"" + version + "\"");
        }
    }
}
