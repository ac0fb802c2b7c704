package dev.pressmark.cli;

import java.util.ArrayList;
import java.util.List;

/** The texts given on the command line, one row each, for a model with one input field. */
final class TextRowSource implements RowSource {

    private final List<String> columns;
    private final List<String> texts;
    private int next;
    private long chunks;

    TextRowSource(String field, List<String> texts) {
        this.columns = List.of(field);
        this.texts = List.copyOf(texts);
    }

    @Override
    public List<String> columns() {
        return columns;
    }

    @Override
    public RowChunk next(int maxRows) {
        if (next >= texts.size()) {
            return null;
        }
        List<String[]> rows = new ArrayList<>();
        while (next < texts.size() && rows.size() < maxRows) {
            rows.add(new String[] {texts.get(next++)});
        }
        return RowChunk.of(chunks++, rows, new int[] {0});
    }

    @Override
    public long bytesRead() {
        return 0;
    }

    @Override
    public BadRows badRows() {
        return new BadRows();
    }

    @Override
    public void close() {
        // nothing held
    }
}
