package dev.pressmark.cli;

import com.fasterxml.jackson.core.JsonParser;
import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.core.JsonToken;
import com.fasterxml.jackson.core.StreamReadConstraints;
import com.fasterxml.jackson.core.exc.StreamConstraintsException;
import com.fasterxml.jackson.dataformat.csv.CsvFactory;
import com.fasterxml.jackson.dataformat.csv.CsvParser;
import dev.pressmark.core.PressmarkException;
import dev.pressmark.core.train.LabelledData;
import java.io.IOException;
import java.io.InputStream;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;

/**
 * The rows of a CSV file (RFC 4180, strict UTF-8, the header naming the columns), read a chunk at
 * a time so that memory does not grow with the file. A row whose field count differs from the
 * header's is bad: an error naming its line (and the input field it lacks), or, when bad rows are
 * skipped, counted and left out. Errors name the file and the line; invalid UTF-8 the byte offset.
 */
final class CsvRowSource implements RowSource {

    private static final CsvFactory CSV = CsvFactory.builder()
            .streamReadConstraints(StreamReadConstraints.builder().maxStringLength(LabelledData.MAX_FIELD_CHARS).build())
            .enable(CsvParser.Feature.SKIP_EMPTY_LINES)
            .build();

    private final Path file;
    private final List<String> inputFields;
    private final boolean skipBadRows;
    private final Utf8Reader reader;
    private final JsonParser parser;
    private final List<String> header;
    private final int[] inputColumns;
    private final BadRows bad = new BadRows();
    private final List<String> fields = new ArrayList<>();
    private long chunks;
    /** The line on which the row being read starts, for messages. */
    private long rowLine = 1;

    private CsvRowSource(Path file, InputStream in, List<String> inputFields, boolean skipBadRows) throws IOException {
        this.file = file;
        this.inputFields = List.copyOf(inputFields);
        this.skipBadRows = skipBadRows;
        this.reader = new Utf8Reader(in, file.toString());
        this.parser = CSV.createParser(reader);
        if (!nextRow()) {
            throw new PressmarkException("empty-data", file + ": no header row; the file is empty");
        }
        this.header = List.copyOf(fields);
        this.inputColumns = new int[inputFields.size()];
        for (int i = 0; i < inputColumns.length; i++) {
            inputColumns[i] = header.indexOf(inputFields.get(i));
            if (inputColumns[i] < 0) {
                throw new PressmarkException("unknown-column", file + ": line 1: no column \"" + inputFields.get(i)
                        + "\", an input field of the model; the header has \"" + String.join("\", \"", header) + "\"");
            }
        }
    }

    /** Opens {@code file} and reads its header, which must have a column for each of {@code inputFields}. */
    static CsvRowSource open(Path file, List<String> inputFields, boolean skipBadRows) {
        InputStream in = null;
        try {
            if (Files.isDirectory(file)) {
                throw new PressmarkException("not-a-file", file + ": a directory, not a CSV file");
            }
            in = Files.newInputStream(file);
            return new CsvRowSource(file, in, inputFields, skipBadRows);
        } catch (NoSuchFileException e) {
            throw new PressmarkException("file-not-found", file + ": no such file");
        } catch (IOException | RuntimeException e) {
            closeQuietly(in, e);
            throw translate(e, file, 1);
        }
    }

    @Override
    public List<String> columns() {
        return header;
    }

    @Override
    public RowChunk next(int maxRows) {
        List<String[]> rows = new ArrayList<>(Math.min(maxRows, 4096));
        try {
            while (rows.size() < maxRows && nextRow()) {
                if (fields.size() == header.size()) {
                    rows.add(fields.toArray(new String[0]));
                } else if (skipBadRows) {
                    bad.add(rowLine);
                } else {
                    throw new PressmarkException("bad-row", file + ": line " + rowLine + ": " + whatIsMissing()
                            + "; fix the row, or give --skip-bad-rows to leave such rows out and count them");
                }
            }
        } catch (IOException e) {
            throw translate(e, file, rowLine);
        }
        return rows.isEmpty() ? null : RowChunk.of(chunks++, rows, inputColumns);
    }

    private String whatIsMissing() {
        for (int i = 0; i < inputColumns.length; i++) {
            if (inputColumns[i] >= fields.size()) {
                return "no value for the input field \"" + inputFields.get(i) + "\" (column " + (inputColumns[i] + 1) + "): the row has "
                        + fields.size() + (fields.size() == 1 ? " field" : " fields") + ", the header " + header.size();
            }
        }
        return fields.size() + (fields.size() == 1 ? " field" : " fields") + ", but the header has " + header.size();
    }

    /** Reads the next row into {@link #fields}; false at the end of the file. */
    private boolean nextRow() throws IOException {
        if (parser.nextToken() == null) {
            return false;
        }
        fields.clear();
        rowLine = parser.currentTokenLocation().getLineNr();
        boolean first = true;
        JsonToken token;
        while ((token = parser.nextToken()) != JsonToken.END_ARRAY && token != null) {
            if (first) {
                rowLine = parser.currentTokenLocation().getLineNr();
                first = false;
            }
            fields.add(parser.getText());
        }
        return true;
    }

    private static RuntimeException translate(Exception e, Path file, long line) {
        if (e instanceof PressmarkException p) {
            return p;
        }
        if (e instanceof StreamConstraintsException) {
            return new PressmarkException("invalid-csv", String.format("%s: line %d: a field longer than %,d characters, the limit on one field"
                    + " (an unclosed quote makes the rest of the file one field)", file, line, LabelledData.MAX_FIELD_CHARS), e);
        }
        if (e instanceof JsonProcessingException j) {
            String what = String.valueOf(j.getOriginalMessage()).startsWith("Missing closing quote")
                    ? "the quoted field that starts on this row has no closing quote" : j.getOriginalMessage();
            return new PressmarkException("invalid-csv", file + ": line " + line + ": " + what, e);
        }
        if (e instanceof RuntimeException r) {
            return r;
        }
        return new PressmarkException("file-unreadable", file + ": cannot read: " + e.getMessage(), e);
    }

    private static void closeQuietly(InputStream in, Exception failure) {
        if (in != null) {
            try {
                in.close();
            } catch (IOException e) {
                failure.addSuppressed(e);
            }
        }
    }

    @Override
    public long bytesRead() {
        return reader.bytesRead();
    }

    @Override
    public BadRows badRows() {
        return bad;
    }

    @Override
    public void close() {
        try {
            parser.close();
            reader.close();
        } catch (IOException e) {
            throw new PressmarkException("file-unreadable", file + ": cannot close: " + e.getMessage(), e);
        }
    }
}
