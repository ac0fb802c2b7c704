package dev.pressmark.core.evaluate;

/** Chance-corrected agreement shared by the two-class and the K-class tables. */
final class Agreement {

    private Agreement() {}

    /**
     * Cohen's kappa from counts: with N rows, A rows on the diagonal and C = Σ_k t_k·p_k (row total
     * times column total), kappa = (N·A − C) / (N² − C), which is (p_o − p_e) / (1 − p_e) multiplied
     * through by N². Exact in longs for N below 3·10⁹; a zero denominator (p_e = 1) gives 0.
     */
    static double kappa(long n, long agreeing, long chance) {
        long denominator = n * n - chance;
        if (denominator == 0) {
            return 0.0;
        }
        return (double) (n * agreeing - chance) / (double) denominator;
    }
}
