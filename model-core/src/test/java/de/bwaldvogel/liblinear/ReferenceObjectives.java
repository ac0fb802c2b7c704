package de.bwaldvogel.liblinear;

/**
 * The primal objective functions of LIBLINEAR's Java port (de.bwaldvogel:liblinear 2.44), which
 * are package-private there; this test-only class sits in the reference's package to call them,
 * so that our objectives are checked against the reference's own code. {@code y} must be +1/-1.
 */
public final class ReferenceObjectives {

    private ReferenceObjectives() {
    }

    /** {@code ½‖w‖² + Σ C_i log(1 + exp(−y_i wᵀx_i))}, bias regularised. */
    public static double logistic(Problem problem, double[] cost, double[] w) {
        return new L2R_LrFunction(problem, parameter(SolverType.L2R_LR), cost).fun(w.clone());
    }

    /** {@code ½‖w‖² + Σ C_i max(0, 1 − y_i wᵀx_i)²}, bias regularised. */
    public static double squaredHinge(Problem problem, double[] cost, double[] w) {
        return new L2R_L2_SvcFunction(problem, parameter(SolverType.L2R_L2LOSS_SVC), cost).fun(w.clone());
    }

    private static Parameter parameter(SolverType solver) {
        Parameter parameter = new Parameter(solver, 1.0, 0.01);
        parameter.setRegularizeBias(true);
        return parameter;
    }
}
