package dev.pressmark.core.tokenize;

import java.util.ArrayList;
import java.util.List;
import java.util.Objects;

/**
 * Several views of one text at once: the tokens of each view, in the order of the views, each
 * prefixed with its view's tag and {@value #SEPARATOR} ({@code chars:<qu}, {@code words:service kit},
 * {@code pieces:##wick}). Tags contain no separator, so the first one in a token ends its tag.
 * Thread-safe when the views are.
 */
public final class ViewsTokenizer implements Tokenizer {

    /** Ends a view's tag in a token. */
    public static final char SEPARATOR = ':';

    private final List<Tokenizer> views;
    private final List<String> tags;

    public ViewsTokenizer(List<Tokenizer> views, List<String> tags) {
        this.views = List.copyOf(views);
        this.tags = List.copyOf(tags);
        if (this.views.size() < 2 || this.views.size() != this.tags.size()) {
            throw new IllegalArgumentException("need at least two views and one tag per view, had " + views.size()
                    + " views and " + tags.size() + " tags");
        }
        for (String tag : this.tags) {
            if (tag.isEmpty() || tag.indexOf(SEPARATOR) >= 0) {
                throw new IllegalArgumentException("a view tag must be non-empty and hold no '" + SEPARATOR + "', was \""
                        + tag + "\"");
            }
        }
    }

    /**
     * The tags of views of these kinds: the kind's short name ({@code pieces}, {@code words},
     * {@code chars}), numbered from 1 when two views share it ({@code chars1}, {@code chars2}).
     */
    public static List<String> tags(List<String> shortNames) {
        List<String> tags = new ArrayList<>(shortNames.size());
        for (int i = 0; i < shortNames.size(); i++) {
            String name = shortNames.get(i);
            int same = 0;
            int upToHere = 0;
            for (int v = 0; v < shortNames.size(); v++) {
                if (shortNames.get(v).equals(name)) {
                    same++;
                    upToHere += v <= i ? 1 : 0;
                }
            }
            tags.add(same == 1 ? name : name + upToHere);
        }
        return tags;
    }

    public List<Tokenizer> views() {
        return views;
    }

    public List<String> tags() {
        return tags;
    }

    /** The index of the view whose tag starts {@code token}, or -1. */
    public int viewOf(String token) {
        int end = token.indexOf(SEPARATOR);
        for (int v = 0; end > 0 && v < tags.size(); v++) {
            if (tags.get(v).length() == end && token.startsWith(tags.get(v))) {
                return v;
            }
        }
        return -1;
    }

    @Override
    public List<String> tokenize(String text) {
        return tokenize(text, Integer.MAX_VALUE, new int[1]);
    }

    /** Keeps at most {@code maxTokens} tokens of each view. */
    @Override
    public List<String> tokenize(String text, int maxTokens, int[] dropped) {
        List<String> out = new ArrayList<>();
        for (int v = 0; v < views.size(); v++) {
            String prefix = tags.get(v) + SEPARATOR;
            List<String> tokens = views.get(v).tokenize(text, maxTokens, dropped);
            for (String token : tokens) {
                out.add(prefix.concat(token));
            }
        }
        return out;
    }
}
