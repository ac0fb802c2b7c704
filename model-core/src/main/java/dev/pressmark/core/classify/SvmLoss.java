package dev.pressmark.core.classify;

/** The loss of a linear SVM on one example with margin {@code m = y w·x}. */
public enum SvmLoss {

    /** {@code max(0, 1 - m)}: the classical soft-margin SVM; its dual is box-constrained. */
    HINGE,

    /**
     * {@code max(0, 1 - m)²}: differentiable, usually as accurate as the hinge, and its dual
     * coordinate descent converges faster; the default.
     */
    SQUARED_HINGE
}
