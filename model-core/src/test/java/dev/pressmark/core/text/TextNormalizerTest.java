package dev.pressmark.core.text;

import static org.assertj.core.api.Assertions.assertThat;

import org.junit.jupiter.api.Test;

class TextNormalizerTest {

    private static final TextNormalizer BERT = TextNormalizer.DEFAULT;
    private static final TextNormalizer CASED = new TextNormalizer(false, false, true);

    // Expected outputs follow the rules of BERT's reference basic tokenizer (Devlin et al. 2019,
    // tokenization.py: _clean_text, _tokenize_chinese_chars, _run_strip_accents, lower()).

    @Test
    void lower_cases_and_strips_accents_through_nfd() {
        assertThat(BERT.normalize("Héllo Wörld ÅNGSTRÖM")).isEqualTo("hello world angstrom");
    }

    @Test
    void removes_nul_replacement_control_and_format_characters() {
        assertThat(BERT.normalize("a\u0000b\uFFFDc\u0007d\u00ADe\u200Bf\u2060g\uFEFFh")).isEqualTo("abcdefgh");
    }

    @Test
    void removes_private_use_characters_and_lone_surrogates() {
        assertThat(BERT.normalize("a\uE000b\uD800c\uDC00d")).isEqualTo("abcd");
    }

    @Test
    void keeps_characters_outside_the_categories_it_removes() {
        // U+0378 is unassigned; the reference keeps unassigned code points.
        assertThat(BERT.normalize("a\u0378b")).isEqualTo("a\u0378b");
    }

    @Test
    void maps_tab_newline_carriage_return_and_unicode_spaces_to_a_space() {
        assertThat(BERT.normalize("a\tb\nc\rd\u00A0e\u2003f\u3000g\u2028h")).isEqualTo("a b c d e f g h");
    }

    @Test
    void drops_other_ascii_controls_rather_than_spacing_them() {
        assertThat(BERT.normalize("a\u000Bb\u000Cc\u001Fd\u0085e")).isEqualTo("abcde");
    }

    @Test
    void puts_spaces_around_cjk_ideographs_but_not_kana_or_hangul() {
        assertThat(CASED.normalize("ab中文cdひらがな")).isEqualTo("ab 中  文 cdひらがな");
    }

    @Test
    void cjk_spacing_covers_the_supplementary_extensions() {
        assertThat(CASED.normalize("x\uD840\uDC00y")).isEqualTo("x \uD840\uDC00 y");
    }

    @Test
    void cjk_spacing_can_be_switched_off() {
        assertThat(new TextNormalizer(true, true, false).normalize("ab中文")).isEqualTo("ab中文");
    }

    @Test
    void lower_casing_is_per_character_without_final_sigma_context() {
        assertThat(new TextNormalizer(true, false, true).normalize("ΟΔΟΣ")).isEqualTo("οδοσ");
    }

    @Test
    void dotted_capital_i_lower_cases_to_i_with_combining_dot_when_accents_are_kept() {
        // Unicode SpecialCasing.txt: U+0130 -> U+0069 U+0307.
        assertThat(new TextNormalizer(true, false, true).normalize("\u0130")).isEqualTo("i\u0307");
        assertThat(BERT.normalize("\u0130")).isEqualTo("i");
    }

    @Test
    void stripping_accents_decomposes_hangul_syllables_into_jamo() {
        assertThat(BERT.normalize("한")).isEqualTo("\u1112\u1161\u11AB");
    }

    @Test
    void keeps_case_and_accents_when_both_are_switched_off() {
        assertThat(CASED.normalize("Héllo")).isEqualTo("Héllo");
    }

    @Test
    void appends_to_an_existing_buffer_without_touching_its_prefix() {
        StringBuilder out = new StringBuilder("KEEP|");
        BERT.normalize("ÉTÉ", out);
        assertThat(out).hasToString("KEEP|ete");
    }
}
