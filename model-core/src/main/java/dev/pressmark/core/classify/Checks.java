package dev.pressmark.core.classify;

/** Argument checks whose messages name the field, its bound and the bad value. */
final class Checks {

    private Checks() {
    }

    static void positive(String name, double value) {
        if (!(value > 0.0)) {
            throw new IllegalArgumentException(name + " must be > 0, was " + value);
        }
        finite(name, value);
    }

    static void nonNegative(String name, double value) {
        if (!(value >= 0.0)) {
            throw new IllegalArgumentException(name + " must be >= 0, was " + value);
        }
        finite(name, value);
    }

    static void atLeastOne(String name, int value) {
        if (value < 1) {
            throw new IllegalArgumentException(name + " must be >= 1, was " + value);
        }
    }

    private static void finite(String name, double value) {
        if (Double.isInfinite(value)) {
            throw new IllegalArgumentException(name + " must be finite, was " + value);
        }
    }
}
