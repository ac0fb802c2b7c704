package dev.pressmark.core.evaluate;

/** The one check of a case-weight array that every weighted metric shares. */
final class CaseWeights {

    private CaseWeights() {}

    /**
     * Checks that {@code weights} is {@code null} (every row weighs 1) or holds one finite,
     * non-negative weight per row, naming the first bad one.
     */
    static void check(double[] weights, int rows) {
        if (weights == null) {
            return;
        }
        if (weights.length != rows) {
            throw new IllegalArgumentException("weights must hold one weight per row, " + rows + ", had " + weights.length);
        }
        for (int i = 0; i < weights.length; i++) {
            double w = weights[i];
            if (!(w >= 0.0 && w < Double.POSITIVE_INFINITY)) {
                throw new IllegalArgumentException("weights[" + i + "] must be a finite number >= 0, was " + w);
            }
        }
    }
}
