package dev.pressmark.core.bench;

import dev.pressmark.core.Progress;
import dev.pressmark.core.reference.MailCorpus;
import dev.pressmark.core.text.TextNormalizer;
import dev.pressmark.core.tokenize.WordCounts;
import dev.pressmark.core.tokenize.WordPieceTrainer;
import dev.pressmark.core.tokenize.WordPieceVocabulary;
import java.util.List;

/** The vocabularies the benchmarks share: trained by us on every mail body of the corpus. */
final class BenchVocabularies {

    private BenchVocabularies() {
    }

    static WordCounts mailBodyCounts() {
        WordCounts counts = new WordCounts(TextNormalizer.DEFAULT);
        List<String> bodies = MailCorpus.bodies();
        for (String body : bodies) {
            counts.addText(body);
        }
        return counts;
    }

    static WordPieceVocabulary trainedOnMailBodies(int size) {
        return new WordPieceTrainer(new WordPieceTrainer.Config(size)).train(mailBodyCounts(), Progress.NONE);
    }
}
