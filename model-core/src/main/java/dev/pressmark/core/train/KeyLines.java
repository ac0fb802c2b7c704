package dev.pressmark.core.train;

import java.util.regex.Matcher;
import java.util.regex.Pattern;

/** Finds the line of a dotted key path ({@code tokenizer.vocab_size}) in YAML text, for messages. */
final class KeyLines {

    /** A list index longer than this is no entry of a config's lists; it is not looked for. */
    private static final int MAX_INDEX_DIGITS = 6;
    private static final Pattern LIST_ITEM = Pattern.compile("(?m)^[ \\t]*-[ \\t]");

    private KeyLines() {
    }

    /** The 1-based line on which the last key of {@code path} appears, or -1 when not found. */
    static int find(String yaml, String path) {
        if (path == null || path.isEmpty()) {
            return -1;
        }
        int from = 0;
        int line = -1;
        for (String key : path.split("\\.")) {
            if (!key.isEmpty() && key.chars().allMatch(Character::isDigit)) {
                if (key.length() > MAX_INDEX_DIGITS) {
                    return line;
                }
                // A list index: the start of that entry of a block list ("- ...") after the key before it.
                Matcher item = LIST_ITEM.matcher(yaml);
                for (int k = 0; k <= Integer.parseInt(key); k++) {
                    if (!item.find(k == 0 ? from : item.end())) {
                        return line;
                    }
                }
                from = item.end();
                line = lineOf(yaml, item.start());
                continue;
            }
            Matcher matcher = Pattern.compile("(?m)(?:^|[{,]|-[ \\t])\\s*\"?" + Pattern.quote(key) + "\"?\\s*:").matcher(yaml);
            if (!matcher.find(from)) {
                return -1;
            }
            from = matcher.end();
            line = lineOf(yaml, matcher.start());
        }
        return line;
    }

    private static int lineOf(String text, int offset) {
        int line = 1;
        for (int i = 0; i < offset; i++) {
            if (text.charAt(i) == '\n') {
                line++;
            }
        }
        // A match that starts at the newline before the key belongs to the key's line.
        return text.charAt(offset) == '\n' ? line + 1 : line;
    }
}
