package dev.pressmark.core.contract;

import dev.pressmark.core.bundle.Manifest;
import java.util.Collections;
import java.util.SortedSet;
import java.util.TreeSet;

/**
 * What a client of a model version relies on: the input fields each predict item carries and the
 * labels an answer may name. Order does not matter to a client (items and probabilities are JSON
 * objects keyed by name), so both are sets.
 */
public record Contract(SortedSet<String> inputFields, SortedSet<String> labels) {

    public Contract {
        inputFields = Collections.unmodifiableSortedSet(new TreeSet<>(inputFields));
        labels = Collections.unmodifiableSortedSet(new TreeSet<>(labels));
    }

    /** The contract a bundle manifest declares (its input fields and labels); absent lists are empty. */
    public static Contract of(Manifest manifest) {
        return new Contract(new TreeSet<>(manifest.inputFields()), new TreeSet<>(manifest.labels()));
    }

    /** The contract of a manifest kept as JSON text. */
    public static Contract ofManifestJson(String manifestJson) {
        return of(Manifest.parse(manifestJson));
    }
}
