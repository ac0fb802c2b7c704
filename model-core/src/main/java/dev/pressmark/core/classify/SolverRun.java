package dev.pressmark.core.classify;

/**
 * How one binary solve ended.
 *
 * @param iterations the passes over the data it made, &gt;= 0
 * @param converged whether it met its tolerance; {@code false} means it stopped at the cap
 */
public record SolverRun(int iterations, boolean converged) {

    public SolverRun {
        if (iterations < 0) {
            throw new IllegalArgumentException("iterations must be >= 0, was " + iterations);
        }
    }
}
