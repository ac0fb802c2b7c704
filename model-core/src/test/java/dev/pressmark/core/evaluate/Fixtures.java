package dev.pressmark.core.evaluate;

import java.util.SplittableRandom;

/** Small random inputs for the property tests, all drawn from one seed. */
final class Fixtures {

    private Fixtures() {}

    /** {@code n} labels in {@code [0, classCount)}, each class appearing at least once when n allows. */
    static int[] labels(SplittableRandom random, int n, int classCount) {
        int[] labels = new int[n];
        for (int i = 0; i < n; i++) {
            labels[i] = i < classCount ? i : random.nextInt(classCount);
        }
        shuffle(labels, random);
        return labels;
    }

    /** Predictions that agree with {@code truth} with probability {@code hit}, else a random class. */
    static int[] noisyCopy(SplittableRandom random, int[] truth, int classCount, double hit) {
        int[] out = new int[truth.length];
        for (int i = 0; i < truth.length; i++) {
            out[i] = random.nextDouble() < hit ? truth[i] : random.nextInt(classCount);
        }
        return out;
    }

    /**
     * Scores on a coarse grid of {@code levels} values (multiples of 0.25), so that ties are common
     * and distinct values are far apart; shifted up for the row's true class so the ranking carries
     * signal.
     */
    static double[] tiedScores(SplittableRandom random, int[] truth, int positiveClass, int levels) {
        double[] out = new double[truth.length];
        for (int i = 0; i < truth.length; i++) {
            int level = random.nextInt(levels) + (truth[i] == positiveClass && random.nextBoolean() ? 1 : 0);
            out[i] = level * 0.25;
        }
        return out;
    }

    static void shuffle(int[] values, SplittableRandom random) {
        for (int i = values.length - 1; i > 0; i--) {
            int j = random.nextInt(i + 1);
            int swap = values[i];
            values[i] = values[j];
            values[j] = swap;
        }
    }
}
