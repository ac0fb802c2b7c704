package dev.pressmark.server;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import dev.pressmark.store.lifecycle.PromotionPolicy;
import java.util.List;
import java.util.Optional;
import org.junit.jupiter.api.Test;

class ServerConfigTest {

    @Test
    void the_defaults_are_the_documented_constants() {
        ServerConfig config = ServerConfig.defaults();
        assertThat(config.listen()).isEqualTo(new ServerConfig.Listen(ServerConfig.DEFAULT_HOST, ServerConfig.DEFAULT_PORT,
                ServerConfig.DEFAULT_MAX_THREADS));
        assertThat(config.limits()).isEqualTo(new ServerConfig.Limits(ServerConfig.DEFAULT_MAX_ITEMS, ServerConfig.DEFAULT_MAX_JSON_BYTES,
                ServerConfig.DEFAULT_MAX_BUNDLE_BYTES, ServerConfig.DEFAULT_MAX_TOKENS_PER_FIELD, ServerConfig.defaultBodyBudgetBytes()));
        assertThat(config.admission()).isEqualTo(new ServerConfig.Admission(ServerConfig.DEFAULT_MAX_CONCURRENT,
                ServerConfig.DEFAULT_REQUEST_TIMEOUT_MS));
        assertThat(config.security()).isEqualTo(new ServerConfig.Security(Optional.empty(), Optional.empty(), List.of(),
                ServerConfig.DEFAULT_OPEN_METRICS));
        assertThat(config.observability()).isEqualTo(new ServerConfig.Observability(ServerConfig.DEFAULT_ACCESS_LOG,
                ServerConfig.DEFAULT_TAP_CAPACITY, ServerConfig.DEFAULT_DRIFT_SAMPLE));
        assertThat(config.promotion()).isEqualTo(PromotionPolicy.defaults());
    }

    @Test
    void each_with_method_changes_its_own_setting_and_nothing_else() {
        ServerConfig defaults = ServerConfig.defaults();
        ServerConfig changed = defaults.withPort(0).withMaxTokensPerField(64).withRequestTimeoutMs(250)
                .withReaderToken(Optional.of(BearerToken.of("reader-token-for-the-test-0123456789"))).withDriftSample(0.5);
        assertThat(changed.listen()).isEqualTo(new ServerConfig.Listen(ServerConfig.DEFAULT_HOST, 0, ServerConfig.DEFAULT_MAX_THREADS));
        assertThat(changed.limits().maxTokensPerField()).isEqualTo(64);
        assertThat(changed.limits().maxItems()).isEqualTo(ServerConfig.DEFAULT_MAX_ITEMS);
        assertThat(changed.admission()).isEqualTo(new ServerConfig.Admission(ServerConfig.DEFAULT_MAX_CONCURRENT, 250));
        assertThat(changed.security().readerToken()).isPresent();
        assertThat(changed.security().adminToken()).isEmpty();
        assertThat(changed.observability()).isEqualTo(new ServerConfig.Observability(ServerConfig.DEFAULT_ACCESS_LOG,
                ServerConfig.DEFAULT_TAP_CAPACITY, 0.5));
        assertThat(changed.promotion()).isEqualTo(defaults.promotion());
    }

    @Test
    void each_group_names_the_setting_its_bound_and_the_bad_value() {
        assertThatThrownBy(() -> ServerConfig.defaults().withPort(70_000)).hasMessage("port must be in [0, 65535], was 70000");
        assertThatThrownBy(() -> new ServerConfig.Listen("127.0.0.1", 0, 2)).hasMessage("maxThreads must be >= 4 threads, was 2");
        assertThatThrownBy(() -> ServerConfig.defaults().withBodyLimits(0, 1)).hasMessage("maxJsonBytes must be >= 1 bytes, was 0");
        assertThatThrownBy(() -> ServerConfig.defaults().withMaxConcurrent(0)).hasMessage("maxConcurrent must be >= 1 requests, was 0");
        assertThatThrownBy(() -> ServerConfig.defaults().withCorsOrigins(List.of("https://example.test/app")))
                .hasMessage("a CORS origin is scheme://host[:port] with no path, was \"https://example.test/app\"");
        assertThatThrownBy(() -> ServerConfig.defaults().withDriftSample(1.5))
                .hasMessage("driftSample must be a share of requests in [0, 1], was 1.5");
    }
}
