package dev.pressmark.cli;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.pressmark.server.PressmarkServer;
import dev.pressmark.server.ServerConfig;
import dev.pressmark.store.BundleStore;
import dev.pressmark.store.jdbc.JdbcStores;
import java.io.IOException;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.Set;
import java.util.TreeSet;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.yaml.snakeyaml.Yaml;
import picocli.CommandLine;

/**
 * The container files under {@code docker/}: no container engine runs here, so this checks what
 * can be checked without one. The YAML files parse; every command line they give is one the
 * program accepts; the ports agree with each other; the health paths are ones the server answers;
 * the environment variables are ones the program reads; the image runs as a numeric non-root user.
 */
class ContainerFilesTest {

    private static final Path DOCKER = Path.of("..", "docker");
    private static final ObjectMapper JSON = new ObjectMapper();
    private static final Set<String> PROGRAM_ENV = Set.of(BundleStore.URL_ENV, BundleStore.USER_ENV, BundleStore.PASSWORD_ENV,
            ServeCommand.ADMIN_TOKEN_ENV);
    private static final Pattern ENV_NAME = Pattern.compile("\\bPRESSMARK_[A-Z_]+\\b");
    private static final Pattern HEALTHCHECK_URL = Pattern.compile("http://127\\.0\\.0\\.1:(\\d+)(/\\S*)");

    @TempDir
    Path dir;

    @Test
    void every_command_line_in_the_container_files_is_accepted_by_the_program() throws IOException {
        List<List<String>> commands = new ArrayList<>();
        Dockerfile dockerfile = Dockerfile.read(DOCKER.resolve("Dockerfile"));
        List<String> entrypoint = dockerfile.entrypoint();
        assertThat(entrypoint.get(0)).isEqualTo("java");
        assertThat(entrypoint.subList(entrypoint.size() - 2, entrypoint.size())).containsExactly("-jar", "/opt/pressmark/pressmark.jar");
        // The class-data archive the image maps at start is the one its build step records.
        assertThat(entrypoint).contains("-XX:SharedArchiveFile=/opt/pressmark/pressmark.jsa");
        assertThat(String.join(" ", dockerfile.instruction("RUN"))).contains("-XX:ArchiveClassesAtExit=/opt/pressmark/pressmark.jsa");
        commands.add(dockerfile.cmd());
        JsonNode compose = compose();
        for (String replica : List.of("replica-a", "replica-b")) {
            commands.add(strings(compose.path("services").path(replica).path("command")));
        }
        for (JsonNode container : deployment().path("spec").path("template").path("spec").path("containers")) {
            commands.add(strings(container.path("args")));
        }
        assertThat(commands).hasSize(4);
        for (List<String> command : commands) {
            assertThat(command).as("a command line").isNotEmpty();
            CommandLine.ParseResult parsed = Main.commandLine().parseArgs(command.toArray(String[]::new));
            assertThat(parsed.subcommand()).as(String.join(" ", command)).isNotNull();
            assertThat(parsed.subcommand().commandSpec().name()).isEqualTo("serve");
            assertThat(parsed.subcommand().matchedOptionValue("--port", 0)).isEqualTo(ServerConfig.DEFAULT_PORT);
            assertThat(parsed.subcommand().matchedOptionValue("--host", "")).isEqualTo("0.0.0.0");
        }
    }

    @Test
    void the_ports_agree_across_the_image_the_proxy_and_the_manifest() throws IOException {
        Dockerfile dockerfile = Dockerfile.read(DOCKER.resolve("Dockerfile"));
        int port = ServerConfig.DEFAULT_PORT;
        assertThat(dockerfile.instruction("EXPOSE")).containsExactly(String.valueOf(port));
        Matcher health = HEALTHCHECK_URL.matcher(String.join(" ", dockerfile.instruction("HEALTHCHECK")));
        assertThat(health.find()).as("the HEALTHCHECK names a loopback URL").isTrue();
        assertThat(Integer.parseInt(health.group(1))).isEqualTo(port);

        String nginx = Files.readString(DOCKER.resolve("nginx.conf"));
        assertThat(nginx).contains("server replica-a:" + port, "server replica-b:" + port);
        Matcher bodyLimit = Pattern.compile("client_max_body_size (\\d+)m;").matcher(nginx);
        assertThat(bodyLimit.find()).isTrue();
        assertThat(Long.parseLong(bodyLimit.group(1)) << 20).isEqualTo(ServerConfig.DEFAULT_MAX_BUNDLE_BYTES);

        JsonNode container = deployment().path("spec").path("template").path("spec").path("containers").get(0);
        assertThat(container.path("ports").get(0).path("containerPort").asInt()).isEqualTo(port);
        assertThat(service().path("spec").path("ports").get(0).path("targetPort").asText())
                .isEqualTo(container.path("ports").get(0).path("name").asText());
        assertThat(service().path("spec").path("selector")).isEqualTo(deployment().path("spec").path("selector").path("matchLabels"));
    }

    @Test
    void the_health_paths_the_files_probe_are_answered_by_the_server() throws Exception {
        Set<String> paths = new TreeSet<>();
        Matcher health = HEALTHCHECK_URL.matcher(String.join(" ", Dockerfile.read(DOCKER.resolve("Dockerfile")).instruction("HEALTHCHECK")));
        assertThat(health.find()).isTrue();
        paths.add(health.group(2));
        JsonNode container = deployment().path("spec").path("template").path("spec").path("containers").get(0);
        paths.add(container.path("readinessProbe").path("httpGet").path("path").asText());
        paths.add(container.path("livenessProbe").path("httpGet").path("path").asText());
        assertThat(paths).containsExactlyInAnyOrder("/health", "/health/ready");

        HttpClient client = HttpClient.newBuilder().connectTimeout(Duration.ofSeconds(5)).build();
        try (BundleStore store = JdbcStores.open("sqlite:" + dir.resolve("store.db"));
                PressmarkServer server = PressmarkServer.start(store, ServerConfig.defaults().withPort(0).withAccessLog(false))) {
            for (String path : paths) {
                HttpResponse<String> response = client.send(HttpRequest.newBuilder(URI.create("http://127.0.0.1:" + server.port() + path))
                        .timeout(Duration.ofSeconds(5)).build(), HttpResponse.BodyHandlers.ofString());
                assertThat(response.statusCode()).as(path).isEqualTo(200);
            }
        }
    }

    @Test
    void every_environment_variable_the_files_set_is_one_the_program_reads() throws IOException {
        Set<String> used = new TreeSet<>();
        for (String file : List.of("Dockerfile", "compose.yaml", "k8s/pressmark.yaml")) {
            Matcher m = ENV_NAME.matcher(Files.readString(DOCKER.resolve(file)));
            while (m.find()) {
                used.add(m.group());
            }
        }
        assertThat(used).isNotEmpty().isSubsetOf(PROGRAM_ENV);
        JsonNode replica = compose().path("services").path("replica-a");
        assertThat(replica.path("environment").path(BundleStore.URL_ENV).asText()).startsWith("jdbc:postgresql://db:5432/");
        assertThat(replica.path("environment").has(ServeCommand.ADMIN_TOKEN_ENV)).isTrue();
    }

    @Test
    void the_image_and_the_pods_run_as_a_numeric_user_other_than_root() throws IOException {
        Dockerfile dockerfile = Dockerfile.read(DOCKER.resolve("Dockerfile"));
        List<String> user = dockerfile.instruction("USER");
        assertThat(user).hasSize(1);
        String uid = user.get(0).split(":")[0];
        assertThat(uid).matches("\\d+");
        assertThat(Integer.parseInt(uid)).isPositive();
        JsonNode security = deployment().path("spec").path("template").path("spec").path("securityContext");
        assertThat(security.path("runAsNonRoot").asBoolean()).isTrue();
        assertThat(security.path("runAsUser").asText()).isEqualTo(uid);
        // The jar the image copies is the one the server module's build names.
        String pom = Files.readString(Path.of("pom.xml"));
        Matcher finalName = Pattern.compile("<finalName>([^<]+)</finalName>").matcher(pom);
        assertThat(finalName.find()).isTrue();
        assertThat(dockerfile.text()).contains("COPY --from=build /src/server/target/" + finalName.group(1) + ".jar ");
    }

    /** The compose file with its anchors resolved, as the compose tool reads it (Jackson's YAML tree keeps aliases unresolved). */
    private static JsonNode compose() throws IOException {
        return JSON.valueToTree(new Yaml().load(Files.readString(DOCKER.resolve("compose.yaml"))));
    }

    private static JsonNode deployment() throws IOException {
        return manifest("Deployment");
    }

    private static JsonNode service() throws IOException {
        return manifest("Service");
    }

    private static JsonNode manifest(String kind) throws IOException {
        for (Object loaded : new Yaml().loadAll(Files.readString(DOCKER.resolve("k8s/pressmark.yaml")))) {
            JsonNode doc = JSON.valueToTree(loaded);
            if (kind.equals(doc.path("kind").asText())) {
                return doc;
            }
        }
        throw new AssertionError("docker/k8s/pressmark.yaml has no " + kind);
    }

    private static List<String> strings(JsonNode array) {
        List<String> out = new ArrayList<>();
        array.forEach(n -> out.add(n.asText()));
        return out;
    }

    /** A Dockerfile's instructions, continuation lines joined, comments dropped. */
    private record Dockerfile(String text, List<String[]> instructions) {

        static Dockerfile read(Path file) throws IOException {
            String text = Files.readString(file);
            List<String[]> instructions = new ArrayList<>();
            StringBuilder line = new StringBuilder();
            for (String raw : text.split("\n", -1)) {
                if (raw.strip().startsWith("#")) {
                    continue;
                }
                if (raw.endsWith("\\")) {
                    line.append(raw, 0, raw.length() - 1).append(' ');
                    continue;
                }
                line.append(raw);
                String joined = line.toString().strip();
                line.setLength(0);
                if (!joined.isEmpty()) {
                    instructions.add(joined.split("\\s+", 2));
                }
            }
            return new Dockerfile(text, instructions);
        }

        /** The arguments of the last stage's instructions of this kind, one string each. */
        List<String> instruction(String name) {
            List<String> out = new ArrayList<>();
            for (String[] i : instructions) {
                if (i[0].equals("FROM")) {
                    out.clear();
                } else if (i[0].equals(name)) {
                    out.add(i.length > 1 ? i[1] : "");
                }
            }
            return out;
        }

        List<String> entrypoint() throws IOException {
            return execForm("ENTRYPOINT");
        }

        List<String> cmd() throws IOException {
            return execForm("CMD");
        }

        private List<String> execForm(String name) throws IOException {
            List<String> found = instruction(name);
            assertThat(found).as(name).hasSize(1);
            return strings(JSON.readTree(found.get(0)));
        }
    }
}
