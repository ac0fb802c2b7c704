package dev.pressmark.core.text;

import java.util.ArrayList;
import java.util.List;

/**
 * Splits normalised text into words as BERT's basic tokenizer does: on whitespace, and around
 * every punctuation character, which becomes a word of its own. Punctuation is Unicode category
 * P* plus the ASCII ranges 33-47, 58-64, 91-96 and 123-126 (so {@code $}, {@code +}, {@code ^}
 * and {@code `} count too).
 *
 * <p>The scanning methods work on offsets so that callers on a hot path allocate nothing:
 * <pre>{@code
 * for (int s = PreTokenizer.wordStart(text, 0); s < text.length(); s = PreTokenizer.wordStart(text, e)) {
 *     int e = PreTokenizer.wordEnd(text, s);
 *     ... text[s, e) is a word ...
 * }
 * }</pre>
 */
public final class PreTokenizer {

    private PreTokenizer() {
    }

    /** The words of {@code text}, which should already be normalised. */
    public static List<String> words(CharSequence text) {
        List<String> words = new ArrayList<>();
        int n = text.length();
        for (int start = wordStart(text, 0); start < n; ) {
            int end = wordEnd(text, start);
            words.add(text.subSequence(start, end).toString());
            start = wordStart(text, end);
        }
        return words;
    }

    /** The index of the first non-whitespace char at or after {@code from}, or the length. */
    public static int wordStart(CharSequence text, int from) {
        int n = text.length();
        int i = from;
        while (i < n) {
            char c = text.charAt(i);
            if (c != ' ' && !TextNormalizer.isWhitespace(c)) {
                return i;
            }
            i++;
        }
        return n;
    }

    /** The end (exclusive) of the word that starts at {@code start}, a non-whitespace char. */
    public static int wordEnd(CharSequence text, int start) {
        int n = text.length();
        int first = Character.codePointAt(text, start);
        int i = start + Character.charCount(first);
        if (isPunctuation(first)) {
            return i;
        }
        while (i < n) {
            char c = text.charAt(i);
            if (c < 0x80) {
                if (c == ' ' || isAsciiPunctuation(c) || TextNormalizer.isWhitespace(c)) {
                    return i;
                }
                i++;
                continue;
            }
            int cp = Character.codePointAt(text, i);
            if (TextNormalizer.isWhitespace(cp) || isPunctuation(cp)) {
                return i;
            }
            i += Character.charCount(cp);
        }
        return n;
    }

    /** Unicode categories Pc, Pd, Ps, Pe, Pi, Pf, Po, or ASCII punctuation. */
    public static boolean isPunctuation(int cp) {
        if (cp < 0x80) {
            return isAsciiPunctuation(cp);
        }
        switch (Character.getType(cp)) {
            case Character.CONNECTOR_PUNCTUATION,
                    Character.DASH_PUNCTUATION,
                    Character.START_PUNCTUATION,
                    Character.END_PUNCTUATION,
                    Character.INITIAL_QUOTE_PUNCTUATION,
                    Character.FINAL_QUOTE_PUNCTUATION,
                    Character.OTHER_PUNCTUATION:
                return true;
            default:
                return false;
        }
    }

    private static boolean isAsciiPunctuation(int c) {
        return (c >= 33 && c <= 47) || (c >= 58 && c <= 64) || (c >= 91 && c <= 96) || (c >= 123 && c <= 126);
    }
}
