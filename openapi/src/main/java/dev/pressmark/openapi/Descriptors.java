package dev.pressmark.openapi;

import dev.pressmark.core.bundle.Bundle;
import dev.pressmark.core.bundle.Prediction;
import dev.pressmark.core.feature.FeatureSpace;
import java.util.ArrayList;
import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/** Describes a loaded bundle for the document. */
public final class Descriptors {

    /** Examples per model: enough to show the shape and a few labels, not one per label of a large model. */
    static final int MAX_EXAMPLES = 3;
    /** Words per example field. */
    static final int WORDS_PER_FIELD = 3;
    private static final String CONTINUATION = "##";

    private Descriptors() {
    }

    /**
     * The descriptor of {@code bundle} served as model {@code name}, version {@code activeTag}.
     * The bundle keeps no training text, so each example is made of the words weighted most
     * towards one label, and carries the bundle's own prediction for it.
     */
    public static ModelDescriptor of(String name, String activeTag, Bundle bundle) {
        return of(name, activeTag, bundle, ModelDescriptor.FIRST_CONTRACT_VERSION);
    }

    /** As {@link #of(String, String, Bundle)}, with the version's contract version as the store recorded it. */
    public static ModelDescriptor of(String name, String activeTag, Bundle bundle, String contractVersion) {
        List<String> labels = bundle.labels();
        List<Map<String, String>> items = new ArrayList<>();
        for (int k = 0; k < Math.min(MAX_EXAMPLES, labels.size()); k++) {
            items.add(exampleItem(bundle, k));
        }
        List<Prediction> predictions = bundle.predict(items);
        List<ModelExample> examples = new ArrayList<>(items.size());
        for (int i = 0; i < items.size(); i++) {
            Prediction p = predictions.get(i);
            examples.add(new ModelExample(items.get(i), p.label(), p.score(), p.probabilities() == null ? Map.of() : p.probabilities()));
        }
        return new ModelDescriptor(name, activeTag, labels, bundle.inputFields(), bundle.hasProbabilities(), examples, contractVersion);
    }

    /** An item whose every field holds the whole words (else the subword pieces) weighted most towards label {@code k}. */
    static Map<String, String> exampleItem(Bundle bundle, int k) {
        boolean binary = bundle.model().weights().numScores() == 1;
        // A binary model has one score, which speaks for the second label: the first label's words weigh least in it.
        List<Integer> order = new ArrayList<>(bundle.featuresByWeight(binary ? 0 : k));
        if (binary && k == 0) {
            Collections.reverse(order);
        }
        FeatureSpace features = bundle.pipeline().features();
        Map<String, String> item = new LinkedHashMap<>();
        for (String field : bundle.inputFields()) {
            List<String> words = new ArrayList<>();
            List<String> pieces = new ArrayList<>();
            for (int j : order) {
                if (!features.column(j).equals(field)) {
                    continue;
                }
                String token = bundle.pipeline().exampleText(features.token(j));
                if (token == null || token.isEmpty() || token.startsWith("[")) {
                    continue;
                }
                if (token.startsWith(CONTINUATION)) {
                    pieces.add(token.substring(CONTINUATION.length()));
                } else {
                    words.add(token);
                }
                if (words.size() == WORDS_PER_FIELD) {
                    break;
                }
            }
            List<String> chosen = words.isEmpty() ? pieces.subList(0, Math.min(WORDS_PER_FIELD, pieces.size())) : words;
            item.put(field, chosen.isEmpty() ? field : String.join(" ", chosen));
        }
        return item;
    }
}
