package dev.pressmark.core.classify;

import java.util.Arrays;
import java.util.Collections;
import java.util.Map;
import java.util.Objects;
import java.util.TreeMap;

/**
 * How much a misclassified example of each class costs, as a factor on {@code c}: an example of
 * class {@code k} gets the cost {@code c · weight(k)} in every binary problem it takes part in,
 * including the "rest" side of one versus rest. (A common alternative weights only the positive
 * side of each one-versus-rest problem; here a class weight means the same thing wherever the
 * class appears. For two classes the two agree.)
 */
public sealed interface ClassWeights {

    /** Every class weighs 1. */
    static ClassWeights none() {
        return new None();
    }

    /**
     * Class {@code k} weighs {@code n / (K · n_k)}, with {@code n} examples, {@code n_k} of class
     * {@code k} and {@code K} classes present, so that every class carries the same total weight;
     * this is the common practice for "balanced" class weights.
     */
    static ClassWeights balanced() {
        return new Balanced();
    }

    /** Explicit weights by class; a class the map does not name weighs 1. */
    static ClassWeights of(Map<Integer, Double> weights) {
        return new Explicit(weights);
    }

    /** The weight of every class {@code 0 .. numClasses - 1} for the given labels. */
    double[] resolve(int[] labels, int numClasses);

    /** Every class weighs 1. */
    record None() implements ClassWeights {

        @Override
        public double[] resolve(int[] labels, int numClasses) {
            double[] weights = new double[numClasses];
            Arrays.fill(weights, 1.0);
            return weights;
        }
    }

    /** Class {@code k} weighs {@code n / (K · n_k)}; see {@link ClassWeights#balanced()}. */
    record Balanced() implements ClassWeights {

        @Override
        public double[] resolve(int[] labels, int numClasses) {
            int[] counts = new int[numClasses];
            for (int label : labels) {
                counts[Labels.check(label, numClasses)]++;
            }
            int present = 0;
            for (int count : counts) {
                present += count > 0 ? 1 : 0;
            }
            double[] weights = new double[numClasses];
            for (int k = 0; k < numClasses; k++) {
                // A class without examples contributes no cost, whatever it weighs.
                weights[k] = counts[k] > 0 ? (double) labels.length / ((double) present * counts[k]) : 1.0;
            }
            return weights;
        }
    }

    /**
     * Explicit weights by class.
     *
     * @param weights class to weight, each class &gt;= 0 and each weight &gt; 0 and finite
     */
    record Explicit(Map<Integer, Double> weights) implements ClassWeights {

        public Explicit {
            Objects.requireNonNull(weights, "weights");
            TreeMap<Integer, Double> copy = new TreeMap<>();
            for (Map.Entry<Integer, Double> entry : weights.entrySet()) {
                int label = Objects.requireNonNull(entry.getKey(), "class weight key");
                double weight = Objects.requireNonNull(entry.getValue(), "class weight of " + label);
                if (label < 0) {
                    throw new IllegalArgumentException("class weight key must be >= 0, was " + label);
                }
                Checks.positive("weight of class " + label, weight);
                copy.put(label, weight);
            }
            weights = Collections.unmodifiableMap(copy);
        }

        @Override
        public double[] resolve(int[] labels, int numClasses) {
            double[] resolved = new None().resolve(labels, numClasses);
            for (Map.Entry<Integer, Double> entry : weights.entrySet()) {
                if (entry.getKey() >= numClasses) {
                    throw new IllegalArgumentException("class weight given for class " + entry.getKey()
                            + ", but classes are 0 .. " + (numClasses - 1));
                }
                resolved[entry.getKey()] = entry.getValue();
            }
            return resolved;
        }
    }
}
