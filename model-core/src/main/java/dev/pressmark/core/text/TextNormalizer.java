package dev.pressmark.core.text;

import com.fasterxml.jackson.annotation.JsonProperty;
import java.text.Normalizer;

/**
 * The normalisation of BERT's basic tokenizer (Devlin, Chang, Lee, Toutanova, NAACL 2019), applied
 * in the order of its reference implementation:
 *
 * <ol>
 *   <li>remove NUL, U+FFFD, lone surrogates and every other character of Unicode category Cc, Cf
 *       or Co (tab, CR and LF count as whitespace instead); map every whitespace character to a
 *       space;
 *   <li>if {@code cjk}, put a space on either side of each CJK ideograph ({@link #isCjk});
 *   <li>if {@code strip_accents}, decompose to NFD and drop non-spacing marks (Mn);
 *   <li>if {@code lowercase}, map each character to lower case, without context (so a final
 *       capital sigma becomes σ, not ς).
 * </ol>
 *
 * <p>Unassigned code points are kept, as the reference keeps them. Splitting the result into
 * words is {@link PreTokenizer}'s job. Instances are immutable and thread-safe.
 */
public record TextNormalizer(
        @JsonProperty("lowercase") boolean lowercase,
        @JsonProperty("strip_accents") boolean stripAccents,
        @JsonProperty("cjk") boolean cjk) {

    /** BERT's uncased defaults: lower-case, strip accents, split CJK ideographs. */
    public static final TextNormalizer DEFAULT = new TextNormalizer(true, true, true);

    /** The first code point that has a canonical decomposition (U+00C0, À). */
    private static final char FIRST_DECOMPOSABLE = '\u00C0';
    /** Flags that {@link #clean} returns. */
    private static final int NON_ASCII = 1;
    private static final int DECOMPOSABLE = 2;

    /** Returns the normalised text; words are separated by spaces or by punctuation. */
    public String normalize(CharSequence text) {
        StringBuilder out = new StringBuilder(text.length() + 16);
        normalize(text, out);
        return out.toString();
    }

    /**
     * Appends the normalised {@code text} to {@code out}. The fast path for text below U+00C0 makes
     * one pass and allocates nothing.
     */
    public void normalize(CharSequence text, StringBuilder out) {
        int start = out.length();
        int found = clean(text, out);
        if (stripAccents && (found & DECOMPOSABLE) != 0) {
            stripAccents(out, start);
        }
        if (lowercase && (found & NON_ASCII) != 0) {
            lowercase(out, start);
        }
    }

    /**
     * Pass 1: cleaning, whitespace, CJK spacing, and lower-casing of ASCII letters, which commutes
     * with the later steps. Returns which of {@link #NON_ASCII} and {@link #DECOMPOSABLE} occurred.
     */
    private int clean(CharSequence text, StringBuilder out) {
        int found = 0;
        int n = text.length();
        for (int i = 0; i < n; i++) {
            char c = text.charAt(i);
            if (c < 0x80) {
                if (c >= 'A' && c <= 'Z') {
                    out.append(lowercase ? (char) (c + ('a' - 'A')) : c);
                } else if (c >= 0x20 && c != 0x7F) {
                    out.append(c);
                } else if (c == '\t' || c == '\n' || c == '\r') {
                    out.append(' ');
                }
                continue;
            }
            found |= NON_ASCII;
            int cp = c;
            if (Character.isHighSurrogate(c) && i + 1 < n && Character.isLowSurrogate(text.charAt(i + 1))) {
                cp = Character.toCodePoint(c, text.charAt(++i));
            }
            if (isRemoved(cp)) {
                continue;
            }
            if (isWhitespace(cp)) {
                out.append(' ');
            } else if (cjk && isCjk(cp)) {
                out.append(' ').appendCodePoint(cp).append(' ');
                found |= DECOMPOSABLE;
            } else {
                out.appendCodePoint(cp);
                found |= cp >= FIRST_DECOMPOSABLE ? DECOMPOSABLE : 0;
            }
        }
        return found;
    }

    private static void stripAccents(StringBuilder out, int start) {
        String decomposed = Normalizer.normalize(out.subSequence(start, out.length()), Normalizer.Form.NFD);
        out.setLength(start);
        int n = decomposed.length();
        for (int i = 0; i < n; ) {
            int cp = decomposed.codePointAt(i);
            i += Character.charCount(cp);
            if (Character.getType(cp) != Character.NON_SPACING_MARK) {
                out.appendCodePoint(cp);
            }
        }
    }

    /** Lower-cases every character from {@code start}; only called when non-ASCII text is present. */
    private static void lowercase(StringBuilder out, int start) {
        String mixed = out.substring(start);
        out.setLength(start);
        for (int i = 0; i < mixed.length(); ) {
            int cp = mixed.codePointAt(i);
            i += Character.charCount(cp);
            if (cp < 0x80) {
                out.append(cp >= 'A' && cp <= 'Z' ? (char) (cp + ('a' - 'A')) : (char) cp);
            } else if (cp == 0x130) {
                // The one unconditional full lower-case mapping (Unicode SpecialCasing.txt): İ -> i + U+0307.
                out.append('i').append('\u0307');
            } else {
                out.appendCodePoint(Character.toLowerCase(cp));
            }
        }
    }

    /** NUL, U+FFFD and categories Cc (except tab, CR, LF), Cf, Co and lone surrogates (Cs). */
    static boolean isRemoved(int cp) {
        if (cp == 0 || cp == 0xFFFD) {
            return true;
        }
        if (cp == '\t' || cp == '\n' || cp == '\r') {
            return false;
        }
        int type = Character.getType(cp);
        return type == Character.CONTROL
                || type == Character.FORMAT
                || type == Character.PRIVATE_USE
                || type == Character.SURROGATE;
    }

    /** Unicode's White_Space property (PropList.txt), as the reference's whitespace test uses it. */
    public static boolean isWhitespace(int cp) {
        switch (cp) {
            case ' ', '\t', '\n', '\r', 0x0B, 0x0C, 0x85, 0xA0, 0x1680, 0x2028, 0x2029, 0x202F, 0x205F, 0x3000:
                return true;
            default:
                return cp >= 0x2000 && cp <= 0x200A;
        }
    }

    /**
     * The CJK ideograph ranges of the reference implementation: the CJK Unified Ideographs block,
     * extensions A to F and the two compatibility blocks. The reference starts its extension-E range
     * at U+2B920 rather than at the block's first code point U+2B820; we follow the reference, since
     * matching it exactly is the point.
     */
    public static boolean isCjk(int cp) {
        return (cp >= 0x4E00 && cp <= 0x9FFF)
                || (cp >= 0x3400 && cp <= 0x4DBF)
                || (cp >= 0x20000 && cp <= 0x2A6DF)
                || (cp >= 0x2A700 && cp <= 0x2B73F)
                || (cp >= 0x2B740 && cp <= 0x2B81F)
                || (cp >= 0x2B920 && cp <= 0x2CEAF)
                || (cp >= 0xF900 && cp <= 0xFAFF)
                || (cp >= 0x2F800 && cp <= 0x2FA1F);
    }
}
