package dev.pressmark.core.tokenize;

import static org.assertj.core.api.Assertions.assertThat;

import dev.pressmark.core.text.TextNormalizer;
import java.util.List;
import org.junit.jupiter.api.Test;

class ViewsTokenizerTest {

    @Test
    void numbers_the_tags_of_views_that_share_a_kind() {
        assertThat(ViewsTokenizer.tags(List.of("chars", "words", "chars"))).containsExactly("chars1", "words", "chars2");
        assertThat(ViewsTokenizer.tags(List.of("pieces", "chars"))).containsExactly("pieces", "chars");
    }

    @Test
    void tags_each_token_with_its_view_and_cuts_each_view_alone() {
        ViewsTokenizer views = new ViewsTokenizer(List.of(new WordTokenizer(TextNormalizer.DEFAULT),
                new CharNgramTokenizer(TextNormalizer.DEFAULT, 3, 3)), List.of("words", "chars"));
        assertThat(views.tokenize("Big kit")).containsExactly("words:big", "words:kit", "chars:<bi", "chars:big",
                "chars:ig>", "chars:<ki", "chars:kit", "chars:it>");
        int[] dropped = new int[1];
        assertThat(views.tokenize("Big kit", 2, dropped)).containsExactly("words:big", "words:kit", "chars:<bi", "chars:big");
        assertThat(dropped[0]).isEqualTo(4);
        assertThat(views.viewOf("chars:<bi")).isEqualTo(1);
        assertThat(views.viewOf("words:chars:x")).isEqualTo(0);
        assertThat(views.viewOf("other:x")).isEqualTo(-1);
    }
}
