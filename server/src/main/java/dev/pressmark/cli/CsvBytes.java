package dev.pressmark.cli;

import dev.pressmark.core.io.CsvQuoting;
import dev.pressmark.core.io.DoubleDigits;
import java.util.Arrays;

/**
 * CSV rows as UTF-8 bytes, quoted exactly as Jackson's CSV writer quotes with its default settings
 * (jackson-dataformat-csv 2.x, {@code CsvEncoder}: comma, double quote, line feed, no escape
 * character), so that {@code predict} writes the same bytes as it did through Jackson, without a
 * char buffer and a writer between the values and the bytes. {@code CsvBytesTest} checks the bytes
 * against Jackson's own writer. Which values are quoted is {@link CsvQuoting}'s rule, shared with
 * the Spark job's CSV lines; a quoted value doubles its quotes.
 */
final class CsvBytes {

    /** Values longer than this are quoted without being looked at ({@link CsvQuoting}). */
    static final int MAX_QUOTE_CHECK_CHARS = CsvQuoting.MAX_QUOTE_CHECK_CHARS;

    private byte[] bytes;
    private int size;
    private boolean rowStarted;

    CsvBytes(int initialBytes) {
        this.bytes = new byte[Math.max(16, initialBytes)];
    }

    /** Appends {@code value} as the next field of the current row. */
    void value(String value) {
        if (rowStarted) {
            ensure(1);
            bytes[size++] = ',';
        }
        rowStarted = true;
        if (CsvQuoting.needsQuotes(value)) {
            quoted(value);
        } else {
            utf8(value);
        }
    }

    /**
     * Appends {@code number} as the next field of the current row, in its shortest digits
     * ({@link DoubleDigits}, the digits of Jackson's writer that the HTTP answers use): what
     * {@link #value} would append for that text, without looking for chars that need quotes. There
     * are none: at most {@value DoubleDigits#MAX_BYTES} chars, all ASCII digits, {@code .},
     * {@code -}, {@code E} or letters of {@code NaN} and {@code Infinity}.
     */
    void number(double number) {
        ensure(DoubleDigits.MAX_BYTES + 1);
        if (rowStarted) {
            bytes[size++] = ',';
        }
        rowStarted = true;
        size = DoubleDigits.write(number, bytes, size);
    }

    /** Ends the current row with a line feed. */
    void endRow() {
        ensure(1);
        bytes[size++] = '\n';
        rowStarted = false;
    }

    byte[] toByteArray() {
        return Arrays.copyOf(bytes, size);
    }


    private void quoted(String value) {
        ensure(1);
        bytes[size++] = '"';
        int from = 0;
        int quote;
        while ((quote = value.indexOf('"', from)) >= 0) {
            utf8(value, from, quote + 1);
            ensure(1);
            bytes[size++] = '"';
            from = quote + 1;
        }
        utf8(value, from, value.length());
        ensure(1);
        bytes[size++] = '"';
    }

    private void utf8(String value) {
        utf8(value, 0, value.length());
    }

    /** UTF-8 of chars {@code from} to {@code to}; a surrogate pair is one four-byte character. */
    private void utf8(String value, int from, int to) {
        ensure(3 * (to - from));
        byte[] out = bytes;
        int at = size;
        for (int i = from; i < to; i++) {
            char c = value.charAt(i);
            if (c < 0x80) {
                out[at++] = (byte) c;
            } else if (c < 0x800) {
                out[at++] = (byte) (0xC0 | (c >> 6));
                out[at++] = (byte) (0x80 | (c & 0x3F));
            } else if (Character.isHighSurrogate(c) && i + 1 < to && Character.isLowSurrogate(value.charAt(i + 1))) {
                int code = Character.toCodePoint(c, value.charAt(++i));
                out[at++] = (byte) (0xF0 | (code >> 18));
                out[at++] = (byte) (0x80 | ((code >> 12) & 0x3F));
                out[at++] = (byte) (0x80 | ((code >> 6) & 0x3F));
                out[at++] = (byte) (0x80 | (code & 0x3F));
            } else {
                out[at++] = (byte) (0xE0 | (c >> 12));
                out[at++] = (byte) (0x80 | ((c >> 6) & 0x3F));
                out[at++] = (byte) (0x80 | (c & 0x3F));
            }
        }
        size = at;
    }

    private void ensure(int more) {
        if (bytes.length - size < more) {
            bytes = Arrays.copyOf(bytes, Math.max(bytes.length * 2, size + more));
        }
    }
}
