package dev.pressmark.openapi;

import dev.pressmark.core.contract.SemanticVersion;
import java.util.HashSet;
import java.util.List;
import java.util.Objects;
import java.util.regex.Pattern;

/**
 * What the document needs to know about one served model: its active version's contract.
 * {@link Descriptors#of} makes one from a loaded bundle.
 *
 * @param name the model's name in the store
 * @param activeTag the tag of the version being served
 * @param labels the labels it predicts, in the bundle's order
 * @param inputFields the text fields every item must carry, in the bundle's order
 * @param probabilities whether predictions carry per-label probabilities
 * @param examples example items with the model's answers, for the document's examples
 * @param contractVersion the semantic version of the active version's contract (its input fields and labels), MAJOR.MINOR.PATCH
 */
public record ModelDescriptor(String name, String activeTag, List<String> labels, List<String> inputFields, boolean probabilities,
        List<ModelExample> examples, String contractVersion) {

    /** The store's rule for model names. */
    static final Pattern NAME = Pattern.compile("[a-z0-9][a-z0-9-]{0,63}");

    /** The contract version of a model whose store kept none: 1.0.0, as the store counts it. */
    public static final String FIRST_CONTRACT_VERSION = "1.0.0";

    public ModelDescriptor {
        Objects.requireNonNull(name, "name");
        Objects.requireNonNull(contractVersion, "contractVersion");
        SemanticVersion.parse(contractVersion);
        Objects.requireNonNull(activeTag, "activeTag");
        labels = List.copyOf(labels);
        inputFields = List.copyOf(inputFields);
        examples = List.copyOf(examples);
        if (!NAME.matcher(name).matches()) {
            throw new IllegalArgumentException("name must match " + NAME.pattern() + ", was \"" + name + "\"");
        }
        if (labels.size() < 2 || new HashSet<>(labels).size() != labels.size()) {
            throw new IllegalArgumentException("labels must be >= 2 distinct values, was " + labels);
        }
        if (inputFields.isEmpty() || new HashSet<>(inputFields).size() != inputFields.size()) {
            throw new IllegalArgumentException("inputFields must be >= 1 distinct names, was " + inputFields);
        }
        for (ModelExample example : examples) {
            if (!example.item().keySet().equals(new HashSet<>(inputFields))) {
                throw new IllegalArgumentException("examples must name exactly the input fields " + inputFields + ", one had "
                        + example.item().keySet());
            }
            if (!labels.contains(example.label())) {
                throw new IllegalArgumentException("examples must predict one of " + labels + ", one predicted " + example.label());
            }
            if (probabilities != !example.probabilities().isEmpty()) {
                throw new IllegalArgumentException("examples must carry probabilities exactly when the model gives them (" + probabilities
                        + "), one had " + example.probabilities());
            }
        }
    }

    /** A descriptor whose contract version is {@value #FIRST_CONTRACT_VERSION}. */
    public ModelDescriptor(String name, String activeTag, List<String> labels, List<String> inputFields, boolean probabilities,
            List<ModelExample> examples) {
        this(name, activeTag, labels, inputFields, probabilities, examples, FIRST_CONTRACT_VERSION);
    }
}
