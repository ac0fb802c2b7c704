package dev.pressmark.server;

import static org.assertj.core.api.Assertions.assertThat;

import dev.pressmark.core.bundle.Bundle;
import dev.pressmark.core.bundle.HtmlReport;
import java.net.http.HttpResponse;
import java.nio.file.Path;
import java.util.Optional;
import java.util.regex.Pattern;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** The web console's shell, assets and charts over real HTTP; the browser test drives the page itself. */
class ConsoleTest {

    private static final String CHARTS = "/console/models/routing/versions/1.0.0/charts.svg";
    private static final byte[] svm = TestBundles.svm();

    @TempDir
    Path dir;

    private Served served(ServerConfig config) {
        return Served.on(dir, config).serving(svm);
    }

    private Served served() {
        return served(Served.config());
    }

    private static HttpResponse<String> raw(Served s, String path, String... headers) throws Exception {
        return java.net.http.HttpClient.newHttpClient().send(s.http.request(path, headers).GET().build(), HttpResponse.BodyHandlers.ofString());
    }

    private static void assertGuarded(HttpResponse<String> response) {
        assertThat(response.headers().firstValue("Content-Security-Policy")).contains("default-src 'self'; script-src 'self'; "
                + "style-src 'self'; img-src 'self' data:; connect-src 'self'; frame-ancestors 'none'; base-uri 'none'; form-action 'self'");
        assertThat(response.headers().firstValue("X-Content-Type-Options")).contains("nosniff");
        assertThat(response.headers().firstValue("Referrer-Policy")).contains("no-referrer");
    }

    private static int count(String text, String regex) {
        return (int) Pattern.compile(regex, Pattern.CASE_INSENSITIVE).matcher(text).results().count();
    }

    @Test
    void the_page_loads_one_script_and_one_stylesheet_of_its_own_and_nothing_inline() throws Exception {
        try (Served s = served()) {
            HttpResponse<String> page = raw(s, "/");
            assertThat(page.statusCode()).isEqualTo(200);
            assertThat(page.headers().firstValue("Content-Type")).hasValueSatisfying(t -> assertThat(t).startsWith("text/html"));
            assertGuarded(page);
            String html = page.body();
            assertThat(count(html, "<script\\b")).isEqualTo(1);
            assertThat(html).contains("<script src=\"/console/app.js\" defer></script>");
            assertThat(count(html, "<link\\b")).isEqualTo(2);
            assertThat(html).contains("<link rel=\"stylesheet\" href=\"/console/app.css\">");
            // An empty icon, so that the browser asks for no favicon.ico
            assertThat(html).contains("<link rel=\"icon\" href=\"data:,\">");
            assertThat(count(html, "<style\\b")).isZero();
            assertThat(count(html, "\\sstyle\\s*=")).isZero();
            assertThat(count(html, "\\son[a-z]+\\s*=")).isZero();
            assertThat(count(html, "(src|href)=\"(https?:)?//")).as("nothing from another origin").isZero();
            assertThat(html).contains("data-reader-token=\"open\"");
        }
    }

    @Test
    void the_script_and_stylesheet_come_with_their_types_and_the_same_policy() throws Exception {
        try (Served s = served()) {
            HttpResponse<String> script = raw(s, "/console/app.js");
            assertThat(script.statusCode()).isEqualTo(200);
            assertThat(script.headers().firstValue("Content-Type")).hasValueSatisfying(t -> assertThat(t).startsWith("text/javascript"));
            assertGuarded(script);
            // Data reaches the page as text nodes only: none of the string-to-markup sinks appear in the script.
            assertThat(script.body()).doesNotContain("innerHTML", "outerHTML", "insertAdjacentHTML", "document.write", "eval(");
            HttpResponse<String> style = raw(s, "/console/app.css");
            assertThat(style.statusCode()).isEqualTo(200);
            assertThat(style.headers().firstValue("Content-Type")).hasValueSatisfying(t -> assertThat(t).startsWith("text/css"));
            assertGuarded(style);
            assertThat(style.body()).contains("prefers-color-scheme: dark").doesNotContain("@import", "url(http");
        }
    }

    @Test
    void the_charts_are_the_reports_own_svg_of_the_named_version() throws Exception {
        Bundle bundle = Bundle.read(svm);
        try (Served s = served()) {
            HttpResponse<String> confusion = raw(s, CHARTS + "?kind=confusion");
            assertThat(confusion.statusCode()).isEqualTo(200);
            assertThat(confusion.headers().firstValue("Content-Type")).hasValueSatisfying(t -> assertThat(t).startsWith("image/svg+xml"));
            assertGuarded(confusion);
            assertThat(confusion.body()).isEqualTo(HtmlReport.confusionSvg(bundle));

            HttpResponse<String> towards = raw(s, CHARTS + "?kind=features&label=garden&count=5");
            assertThat(towards.statusCode()).isEqualTo(200);
            assertThat(towards.body()).isEqualTo(HtmlReport.featureBarsSvg(bundle, "garden", true, 5));
            HttpResponse<String> away = raw(s, CHARTS + "?kind=features&label=garden&towards=false");
            assertThat(away.body()).isEqualTo(HtmlReport.featureBarsSvg(bundle, "garden", false, Console.DEFAULT_FEATURES));
        }
    }

    @Test
    void a_chart_request_that_names_no_chart_label_or_version_is_a_problem_detail() {
        try (Served s = served()) {
            Http.Answer kind = s.http.get(CHARTS + "?kind=pie");
            assertThat(kind.status()).isEqualTo(400);
            assertThat(kind.contentType()).startsWith("application/problem+json");
            assertThat(kind.json().at("/errors/0/field").asText()).isEqualTo("kind");

            Http.Answer label = s.http.get(CHARTS + "?kind=features&label=lighting");
            assertThat(label.status()).isEqualTo(400);
            assertThat(label.json().get("detail").asText()).isEqualTo("label: must be one of electrical, garden, plumbing, was \"lighting\"");

            Http.Answer version = s.http.get("/console/models/routing/versions/9.9.9/charts.svg?kind=confusion");
            assertThat(version.status()).isEqualTo(404);
            assertThat(version.json().get("type").asText()).isEqualTo("urn:pressmark:problem:no-such-version");
        }
    }

    @Test
    void with_a_reader_token_the_page_still_loads_but_the_charts_need_the_token() throws Exception {
        ServerConfig config = Served.config()
                .withReaderToken(Optional.of(BearerToken.of(Served.READER)));
        try (Served s = served(config)) {
            HttpResponse<String> page = raw(s, "/");
            assertThat(page.statusCode()).isEqualTo(200);
            assertThat(page.body()).contains("data-reader-token=\"required\"");
            assertThat(raw(s, "/console/app.js").statusCode()).isEqualTo(200);
            assertThat(s.http.get(CHARTS + "?kind=confusion").status()).isEqualTo(401);
            assertThat(s.http.get(CHARTS + "?kind=confusion", "Authorization", "Bearer " + Served.READER).status()).isEqualTo(200);
        }
    }
}
