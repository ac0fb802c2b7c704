package dev.pressmark.server;

/**
 * The access log's line: {@code key=value} pairs separated by single spaces, e.g.
 * {@code method=POST path=/models/routing/predict status=200 ms=1.23 model=routing version=v2 items=1}.
 * A value that holds anything but visible ASCII is written in double quotes with backslash
 * escapes, so that a path cannot break the line or pass off text as another field. Headers,
 * query strings and bodies are never written: they may carry tokens or customer text.
 */
final class AccessLog {

    /** The SLF4J logger the lines go to, at INFO. */
    static final String LOGGER = "dev.pressmark.access";

    private static final char[] HEX = "0123456789abcdef".toCharArray();

    private AccessLog() {
    }

    /**
     * One request's line. {@code model} and {@code version} are left out when empty, {@code items}
     * when negative (the request carried none).
     */
    static String line(String method, String path, int status, float ms, String model, String version, int items) {
        StringBuilder line = new StringBuilder(96 + path.length());
        line.append("method=");
        appendValue(line, method);
        line.append(" path=");
        appendValue(line, path);
        line.append(" status=").append(status).append(" ms=");
        appendMillis(line, ms);
        if (!model.isEmpty()) {
            line.append(" model=");
            appendValue(line, model);
        }
        if (!version.isEmpty()) {
            line.append(" version=");
            appendValue(line, version);
        }
        if (items >= 0) {
            line.append(" items=").append(items);
        }
        return line.toString();
    }

    /** Milliseconds with two decimals, without the cost of a formatter. */
    static void appendMillis(StringBuilder out, float ms) {
        if (!(ms >= 0) || ms > Long.MAX_VALUE / 100) {
            out.append('-');
            return;
        }
        long hundredths = Math.round(ms * 100.0);
        long fraction = hundredths % 100;
        out.append(hundredths / 100).append('.');
        if (fraction < 10) {
            out.append('0');
        }
        out.append(fraction);
    }

    /** The value as is when it is visible ASCII without quotes or backslashes, else quoted and escaped. */
    static void appendValue(StringBuilder out, String value) {
        if (!value.isEmpty() && plain(value)) {
            out.append(value);
            return;
        }
        out.append('"');
        for (int i = 0; i < value.length(); i++) {
            char c = value.charAt(i);
            switch (c) {
                case '"' -> out.append("\\\"");
                case '\\' -> out.append("\\\\");
                case '\n' -> out.append("\\n");
                case '\r' -> out.append("\\r");
                case '\t' -> out.append("\\t");
                default -> {
                    if (breaksLines(c)) {
                        out.append("\\u").append(HEX[c >> 12 & 0xF]).append(HEX[c >> 8 & 0xF]).append(HEX[c >> 4 & 0xF]).append(HEX[c & 0xF]);
                    } else {
                        out.append(c);
                    }
                }
            }
        }
        out.append('"');
    }

    private static boolean plain(String value) {
        for (int i = 0; i < value.length(); i++) {
            char c = value.charAt(i);
            if (c <= ' ' || c >= 0x7F || c == '"' || c == '\\') {
                return false;
            }
        }
        return true;
    }

    /**
     * Control characters (C0, DEL, C1) and the Unicode line and paragraph separators: any of them
     * can end or disguise a line in a terminal or a log viewer.
     */
    private static boolean breaksLines(char c) {
        return c < ' ' || (c >= 0x7F && c <= 0x9F) || c == '\u2028' || c == '\u2029';
    }
}
