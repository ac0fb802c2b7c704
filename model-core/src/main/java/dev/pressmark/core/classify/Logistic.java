package dev.pressmark.core.classify;

/** The logistic function and its relatives in forms that neither overflow nor cancel. */
final class Logistic {

    private Logistic() {
    }

    /** {@code log(1 + exp(z))}. */
    static double softplus(double z) {
        return Math.max(z, 0.0) + Math.log1p(Math.exp(-Math.abs(z)));
    }

    /** {@code 1 / (1 + exp(-t))}. */
    static double sigmoid(double t) {
        if (t >= 0.0) {
            return 1.0 / (1.0 + Math.exp(-t));
        }
        double e = Math.exp(t);
        return e / (1.0 + e);
    }

    /** {@code log(sigmoid(t))}. */
    static double logSigmoid(double t) {
        return -softplus(-t);
    }

    /**
     * Turns one logit per score into a probability per class: for one score (a binary model) the
     * class-1 probability is {@code sigmoid(t[0])} and class 0 gets the rest; for K scores (one
     * versus rest) each class gets {@code sigmoid(t[k])}, normalised so that the K sum to 1, the
     * normalisation done on logarithms so that it survives every class being very unlikely.
     */
    static void probabilities(double[] logits, int scores, double[] out) {
        if (scores == 1) {
            out[1] = sigmoid(logits[0]);
            out[0] = sigmoid(-logits[0]);
            return;
        }
        double max = Double.NEGATIVE_INFINITY;
        for (int k = 0; k < scores; k++) {
            out[k] = logSigmoid(logits[k]);
            max = Math.max(max, out[k]);
        }
        double sum = 0.0;
        for (int k = 0; k < scores; k++) {
            out[k] = Math.exp(out[k] - max);
            sum += out[k];
        }
        for (int k = 0; k < scores; k++) {
            out[k] /= sum;
        }
    }
}
