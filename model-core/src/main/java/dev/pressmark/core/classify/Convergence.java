package dev.pressmark.core.classify;

import java.util.List;
import java.util.Objects;
import java.util.Optional;

/**
 * How the binary solves behind a model ended, one {@link SolverRun} per score.
 *
 * @param runs in score order, at least one
 */
public record Convergence(List<SolverRun> runs) {

    public Convergence {
        runs = List.copyOf(Objects.requireNonNull(runs, "runs"));
        if (runs.isEmpty()) {
            throw new IllegalArgumentException("runs must hold at least one solver run, was empty");
        }
    }

    /** Whether every binary solve met its tolerance. */
    public boolean converged() {
        for (SolverRun run : runs) {
            if (!run.converged()) {
                return false;
            }
        }
        return true;
    }

    /** The most passes any binary solve made. */
    public int maxIterations() {
        int max = 0;
        for (SolverRun run : runs) {
            max = Math.max(max, run.iterations());
        }
        return max;
    }

    /**
     * A warning for the user when some solve stopped at the iteration cap, to pass to
     * {@link dev.pressmark.core.Progress#note(String)}; empty when all converged.
     */
    public Optional<String> warning(String solver, int maxIterations, double tolerance) {
        long stopped = runs.stream().filter(run -> !run.converged()).count();
        if (stopped == 0) {
            return Optional.empty();
        }
        return Optional.of(solver + ": " + stopped + " of " + runs.size() + " binary problems stopped at maxIterations = "
                + maxIterations + " before reaching tolerance " + tolerance
                + "; the model may be less accurate than it could be. Raise maxIterations or lower c.");
    }
}
