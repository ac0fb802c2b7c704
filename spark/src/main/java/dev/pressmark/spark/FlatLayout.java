package dev.pressmark.spark;

import com.fasterxml.jackson.core.io.NumberOutput;
import dev.pressmark.core.bundle.ScoredRows;
import java.util.ArrayList;
import java.util.List;
import org.apache.spark.sql.types.DataTypes;
import org.apache.spark.sql.types.StructField;

/**
 * The prediction as flat text columns for a table that holds no structs (CSV): {@code label},
 * {@code score}, {@code p:<label>} per label when the model gives probabilities, and
 * {@code version}, filled straight from the batch's scores, without a map per row. Numbers are
 * written as {@code pressmark predict --data} and the HTTP service write them: the shortest digits
 * that read back as the same double (Jackson's {@code NumberOutput}, Giulietti's Schubfach), in
 * {@link Double#toString(double)}'s layout; JDK 17's {@code Double.toString}, which Spark's CSV
 * writer calls on a double column, is several times slower and sometimes writes a digit more.
 */
final class FlatLayout implements ScoredLayout {

    private static final long serialVersionUID = 1L;

    private final List<String> labels;
    private final boolean probabilities;
    private final String version;

    FlatLayout(List<String> labels, boolean probabilities, String version) {
        this.labels = List.copyOf(labels);
        this.probabilities = probabilities;
        this.version = version;
    }

    /** The columns' names, in the order {@link #append} fills them. */
    List<String> columns() {
        List<String> names = new ArrayList<>(width());
        names.add(PredictionColumn.LABEL);
        names.add(PredictionColumn.SCORE);
        if (probabilities) {
            labels.forEach(label -> names.add("p:" + label));
        }
        names.add(PredictionColumn.VERSION);
        return names;
    }

    /** The columns as a schema's fields: text, null for a row with a null text. */
    List<StructField> fields() {
        List<StructField> fields = new ArrayList<>(width());
        columns().forEach(name -> fields.add(DataTypes.createStructField(name, DataTypes.StringType, true)));
        return fields;
    }

    @Override
    public int width() {
        return 3 + (probabilities ? labels.size() : 0);
    }

    @Override
    public void append(Object[] values, int at, ScoredRows scored, int k) {
        if (k < 0) {
            return;
        }
        int c = at;
        values[c++] = labels.get(scored.label(k));
        values[c++] = NumberOutput.toString(scored.score(k), true);
        for (int l = 0; probabilities && l < labels.size(); l++) {
            values[c++] = NumberOutput.toString(scored.probability(k, l), true);
        }
        values[c] = version;
    }
}
