package dev.pressmark.core.evaluate;

/** Chance-corrected agreement shared by the two-class and the K-class tables. */
final class Agreement {

    private Agreement() {}

    /**
     * Cohen's kappa from summed weights (counts when every weight is 1): with N in all, A on the
     * diagonal and C = Σ_k t_k·p_k (row total times column total), kappa = (N·A − C) / (N² − C),
     * which is (p_o − p_e) / (1 − p_e) multiplied through by N². Exact for integer counts while N²
     * stays below 2<sup>53</sup> (N below 9·10⁷); a zero denominator (p_e = 1) gives 0.
     */
    static double kappa(double n, double agreeing, double chance) {
        double denominator = n * n - chance;
        if (denominator == 0) {
            return 0.0;
        }
        return (n * agreeing - chance) / denominator;
    }
}
