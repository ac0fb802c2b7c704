package dev.pressmark.server;

import static org.assertj.core.api.Assertions.assertThat;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * The live document linted by Spectral (@stoplight/spectral-cli, from the npm registry) with its
 * standard {@code spectral:oas} ruleset. The build passes the binary's path as
 * {@code pressmark.spectral}; .ci/run installs it, so CI always runs this check. Without the
 * binary the test is skipped and says how to install it.
 */
@Tag("slow") // runs the Spectral linter (Node) on a live document
class SpectralLintTest {

    /** Spectral's severities in its JSON output. */
    private static final int ERROR = 0;
    private static final int WARNING = 1;
    private static final long LINT_TIMEOUT_S = 180;

    @TempDir
    Path dir;

    @Test
    void the_live_document_has_no_errors_or_warnings_under_the_standard_openapi_ruleset() throws Exception {
        Path spectral = Path.of(System.getProperty("pressmark.spectral", "spectral-not-configured"));
        assumeTrue(Files.isExecutable(spectral), "Spectral is not installed at " + spectral
                + "; install it with: npm install --prefix ~/.cache/pressmark/spectral @stoplight/spectral-cli (as .ci/run does)");
        Path ruleset = Path.of(System.getProperty("pressmark.spectral.ruleset", "../.spectral.yaml")).toAbsolutePath();
        assertThat(ruleset).exists();
        Path out = Path.of(System.getProperty("pressmark.openapi.out", "target/openapi")).toAbsolutePath();
        Files.createDirectories(out);

        byte[] bundle = TestBundles.svm();
        ServerConfig config = Served.config()
                .withReaderToken(Optional.of(BearerToken.of(Served.READER)));
        Path document = out.resolve("live.json");
        try (Served s = Served.on(dir, config)) {
            // a hyphenated name too, whose schema names differ from its path
            for (String model : List.of("routing", "shop-listings")) {
                assertThat(s.http.put("/models/" + model + "/versions/1.0.0", "application/octet-stream", bundle, Served.AS_ADMIN).status())
                        .isEqualTo(201);
                assertThat(s.http.putJson("/models/" + model + "/active", "{\"tag\":\"1.0.0\"}", Served.AS_ADMIN).status()).isEqualTo(200);
            }
            Http.Answer answer = s.http.get("/openapi.json", "Authorization", "Bearer " + Served.READER);
            assertThat(answer.body()).contains("/models/shop-listings/predict");
            Files.writeString(document, answer.body());
        }

        Path report = out.resolve("spectral.json");
        Process lint = new ProcessBuilder(spectral.toString(), "lint", document.toString(), "--ruleset", ruleset.toString(),
                "--format", "json", "--output", report.toString(), "--fail-severity", "error")
                .redirectErrorStream(true).redirectOutput(out.resolve("spectral.log").toFile()).start();
        assertThat(lint.waitFor(LINT_TIMEOUT_S, TimeUnit.SECONDS)).as("spectral finished within " + LINT_TIMEOUT_S + " s").isTrue();
        assertThat(report).as("spectral's report; its log: " + Files.readString(out.resolve("spectral.log"))).exists();

        List<String> errors = new ArrayList<>();
        List<String> warnings = new ArrayList<>();
        for (JsonNode finding : new ObjectMapper().readTree(report.toFile())) {
            String line = finding.path("code").asText() + " at " + finding.path("path") + ": " + finding.path("message").asText();
            if (finding.path("severity").asInt() == ERROR) {
                errors.add(line);
            } else if (finding.path("severity").asInt() == WARNING) {
                warnings.add(line);
            }
        }
        assertThat(errors).as("spectral errors").isEmpty();
        assertThat(warnings).as("spectral warnings").isEmpty();
        assertThat(lint.exitValue()).as("spectral's exit code").isZero();
    }
}
