package dev.pressmark.server;

import static org.assertj.core.api.Assertions.assertThat;

import java.math.BigDecimal;
import java.math.RoundingMode;
import net.jqwik.api.Example;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.constraints.FloatRange;
import org.apache.commons.text.StringEscapeUtils;

/** The access log's line format: one line whatever the values hold, and each value readable back as it was. */
class AccessLogTest {

    @Property
    void any_value_is_written_on_one_line_and_reads_back_as_it_was(@ForAll String value) {
        StringBuilder out = new StringBuilder();
        AccessLog.appendValue(out, value);
        String written = out.toString();
        assertThat(written).doesNotContain("\u2028", "\u2029");
        assertThat(written.chars().filter(c -> c < ' ' || (c >= 0x7F && c <= 0x9F))).isEmpty();
        if (written.startsWith("\"")) {
            assertThat(written).endsWith("\"").hasSizeGreaterThanOrEqualTo(2);
            // the escapes are Java's string-literal escapes (JLS 17, 3.10.7); commons-text's unescaper inverts them
            assertThat(StringEscapeUtils.unescapeJava(written.substring(1, written.length() - 1))).isEqualTo(value);
        } else {
            assertThat(written).isEqualTo(value).isNotEmpty().doesNotContain(" ", "\"", "\\");
        }
    }

    @Example
    void a_path_that_tries_to_add_a_line_or_a_field_stays_one_quoted_value() {
        String forged = "/models/x status=500 ms=0.00\n2026-01-01T00:00:00Z INFO dev.pressmark.access - method=DELETE path=/";
        String line = AccessLog.line("GET", forged, 404, 1.5f, "", "", -1);
        assertThat(line).doesNotContain("\n").startsWith("method=GET path=\"/models/x status=500 ms=0.00\\n2026-01-01T00:00:00Z INFO ")
                .endsWith("path=/\" status=404 ms=1.50");
    }

    @Example
    void a_served_predict_names_model_version_and_items() {
        assertThat(AccessLog.line("POST", "/models/routing/predict", 200, 1.234f, "routing", "v2", 1))
                .isEqualTo("method=POST path=/models/routing/predict status=200 ms=1.23 model=routing version=v2 items=1");
    }

    @Property
    void milliseconds_are_written_rounded_half_up_to_two_decimals(@ForAll @FloatRange(min = 0, max = 1e6f) float ms) {
        StringBuilder out = new StringBuilder();
        AccessLog.appendMillis(out, ms);
        // the JDK's decimal arithmetic as the reference for the hand-written formatting
        String expected = new BigDecimal(ms * 100.0).setScale(0, RoundingMode.HALF_UP).movePointLeft(2).setScale(2, RoundingMode.UNNECESSARY)
                .toPlainString();
        assertThat(out.toString()).isEqualTo(expected);
    }

    @Example
    void a_duration_that_is_not_a_number_is_written_as_a_dash() {
        StringBuilder out = new StringBuilder();
        AccessLog.appendMillis(out, Float.NaN);
        assertThat(out.toString()).isEqualTo("-");
    }
}
