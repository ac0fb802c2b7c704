package dev.pressmark.core.bench;

import dev.pressmark.core.reference.MailCorpus;
import dev.pressmark.core.reference.SampleVocabularies;
import dev.pressmark.core.tokenize.WordPieceVocabulary;

/** The vocabularies the benchmarks share. */
final class BenchVocabularies {

    private BenchVocabularies() {
    }

    static WordPieceVocabulary trainedOnMailBodies(int size) {
        return SampleVocabularies.fromTexts(MailCorpus.bodies(), size - 2000, 1500);
    }
}
