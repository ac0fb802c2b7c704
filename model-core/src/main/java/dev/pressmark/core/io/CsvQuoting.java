package dev.pressmark.core.io;

/**
 * When a CSV value is quoted: the rule of Jackson's CSV writer with its default settings
 * (jackson-dataformat-csv 2.x, {@code CsvEncoder}: comma, double quote, line feed, no escape
 * character), which {@code predict --data} wrote its rows with before it encoded them itself, and
 * which the Spark job's CSV lines follow so that both write the same bytes. A value longer than
 * {@value #MAX_QUOTE_CHECK_CHARS} chars is quoted without being looked at; a shorter one when it
 * holds a char below {@code '-'} (the separator, the quote, the line break, space, control
 * characters) or a backslash. A quoted value doubles its quotes. The writers' tests check their
 * bytes against Jackson's own writer.
 */
public final class CsvQuoting {

    /** Jackson's {@code CsvEncoder}: values longer than this are quoted without looking at them. */
    public static final int MAX_QUOTE_CHECK_CHARS = 24;
    /** Jackson's {@code CsvEncoder}: one above the highest of separator, quote and line break. */
    private static final char MIN_SAFE_CHAR = ',' + 1;

    private CsvQuoting() {
    }

    /** Whether {@code value} is written between quotes. */
    public static boolean needsQuotes(String value) {
        int length = value.length();
        if (length > MAX_QUOTE_CHECK_CHARS) {
            return true;
        }
        for (int i = 0; i < length; i++) {
            char c = value.charAt(i);
            if (c < MIN_SAFE_CHAR || c == '\\') {
                return true;
            }
        }
        return false;
    }
}
