package dev.pressmark.core.bundle;

/**
 * How much one feature moved the score of the predicted label: its weight times its value.
 *
 * @param feature the feature's name, {@code column:token}
 * @param contribution signed; positive pushed towards the predicted label
 */
public record Contribution(String feature, double contribution) {
}
