package dev.pressmark.cli;

import com.fasterxml.jackson.databind.node.JsonNodeFactory;
import dev.pressmark.core.bundle.Bundle;
import dev.pressmark.core.bundle.Manifest;
import dev.pressmark.core.bundle.ModelWeights;
import dev.pressmark.core.bundle.TextPipeline;
import dev.pressmark.core.bundle.TokenizerSpec;
import dev.pressmark.core.classify.LinearWeights;
import dev.pressmark.core.classify.PlattScaling;
import dev.pressmark.core.feature.FeatureConfig;
import dev.pressmark.core.feature.FeatureSpace;
import dev.pressmark.core.text.TextNormalizer;
import java.util.ArrayList;
import java.util.List;
import java.util.SplittableRandom;

/**
 * Bundles made in code that load as models (the store loads every bundle it is given): whole-word
 * features over generated tokens, random weights. Quicker than training when what the model
 * predicts does not matter to a test.
 */
public final class LoadableBundles {

    public static final List<String> FIELDS = List.of("title");

    private LoadableBundles() {
    }

    /** A model of {@code fields} and {@code labels} over {@code features} features per field, weights from {@code seed}. */
    public static byte[] of(long seed, List<String> fields, List<String> labels, int features) {
        return of(seed, fields, labels, features, false);
    }

    /**
     * As {@link #of(long, List, List, int)}, with a Platt sigmoid per score (random, a < 0) when
     * {@code probabilities}, so that predictions carry a probability per label.
     */
    public static byte[] of(long seed, List<String> fields, List<String> labels, int features, boolean probabilities) {
        SplittableRandom random = new SplittableRandom(seed);
        List<List<List<String>>> rows = new ArrayList<>();
        for (int i = 0; i < features; i += 8) {
            List<List<String>> row = new ArrayList<>();
            for (int c = 0; c < fields.size(); c++) {
                List<String> tokens = new ArrayList<>();
                for (int t = i; t < Math.min(features, i + 8); t++) {
                    tokens.add("w" + t);
                }
                row.add(tokens);
            }
            rows.add(row);
        }
        FeatureSpace space = FeatureSpace.fit(FeatureConfig.defaults().withMaxTokens(features * fields.size()), fields, rows);
        double[][] w = new double[labels.size() == 2 ? 1 : labels.size()][space.featureCount() + 1];
        for (double[] score : w) {
            for (int j = 0; j < score.length; j++) {
                score[j] = random.nextDouble(-1, 1);
            }
        }
        List<PlattScaling> platt = new ArrayList<>();
        for (int k = 0; probabilities && k < w.length; k++) {
            platt.add(new PlattScaling(random.nextDouble(-3, -0.5), random.nextDouble(-1, 1)));
        }
        TokenizerSpec spec = TokenizerSpec.words(TextNormalizer.DEFAULT);
        return Bundle.write(Manifest.named("routing"), labels,
                new TextPipeline(spec, spec.tokenizer(), space), new ModelWeights(ModelWeights.LINEAR_SVM, LinearWeights.of(labels.size(), 1.0, w),
                        platt), JsonNodeFactory.instance.objectNode());
    }

    /** A two-label model of the field {@code title}. */
    public static byte[] of(long seed) {
        return of(seed, FIELDS, List.of("lighting", "plumbing"), 16);
    }
}
