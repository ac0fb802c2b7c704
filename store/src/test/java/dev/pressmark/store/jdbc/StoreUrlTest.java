package dev.pressmark.store.jdbc;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import dev.pressmark.store.StoreException;
import java.nio.file.Path;
import java.util.Map;
import org.junit.jupiter.api.Test;

class StoreUrlTest {

    @Test
    void both_sqlite_forms_name_the_same_file() {
        assertThat(StoreUrl.parse("sqlite:./pressmark.db", Map.of()).sqliteFile()).isEqualTo(Path.of("./pressmark.db"));
        assertThat(StoreUrl.parse("jdbc:sqlite:/var/lib/p.db", Map.of()).sqliteFile()).isEqualTo(Path.of("/var/lib/p.db"));
        assertThat(StoreUrl.parse("sqlite:p.db", Map.of()).dialect()).isEqualTo(Dialect.SQLITE);
    }

    @Test
    void an_unknown_scheme_is_refused_listing_the_supported_ones() {
        assertThatThrownBy(() -> StoreUrl.parse("mysql://db/pressmark", Map.of()))
                .isInstanceOf(StoreException.class)
                .hasMessage("unsupported store URL scheme \"mysql:\"; supported: sqlite:PATH, jdbc:sqlite:PATH, jdbc:postgresql://HOST[:PORT]/DATABASE");
        assertThatThrownBy(() -> StoreUrl.parse("pressmark.db", Map.of()))
                .hasMessageStartingWith("a store URL needs a scheme; supported: sqlite:PATH");
        assertThatThrownBy(() -> StoreUrl.parse("", Map.of())).hasMessageStartingWith("the store URL is empty");
    }

    @Test
    void an_in_memory_sqlite_database_is_refused_because_each_pooled_connection_would_see_another() {
        assertThatThrownBy(() -> StoreUrl.parse("sqlite::memory:", Map.of())).isInstanceOf(StoreException.class)
                .hasMessageContaining("plain file path");
    }

    @Test
    void postgres_credentials_come_from_the_url_first_then_from_the_environment() {
        Map<String, String> env = Map.of(StoreUrl.USER_ENV, "envuser", StoreUrl.PASSWORD_ENV, "envpass");
        StoreUrl fromEnv = StoreUrl.parse("jdbc:postgresql://db.internal:6543/models", env);
        assertThat(fromEnv.user()).isEqualTo("envuser");
        assertThat(fromEnv.password()).isEqualTo("envpass");
        assertThat(fromEnv.host()).isEqualTo("db.internal");
        assertThat(fromEnv.port()).isEqualTo(6543);
        assertThat(fromEnv.database()).isEqualTo("models");
        StoreUrl fromUrl = StoreUrl.parse("jdbc:postgresql://db.internal/models?user=u&password=p", env);
        assertThat(fromUrl.user()).isEqualTo("u");
        assertThat(fromUrl.password()).isEqualTo("p");
        assertThat(fromUrl.port()).isEqualTo(5432);
    }

    @Test
    void descriptions_and_redacted_urls_never_show_the_password() {
        StoreUrl url = StoreUrl.parse("jdbc:postgresql://db:5432/models?user=u&password=topsecret", Map.of());
        assertThat(url.describe()).isEqualTo("PostgreSQL at db:5432/models");
        assertThat(url.toString()).doesNotContain("topsecret");
        assertThat(StoreUrl.redact("jdbc:postgresql://db/m?password=topsecret&user=u")).isEqualTo("jdbc:postgresql://db/m?password=***&user=u");
    }
}
