package dev.pressmark.spark;

import dev.pressmark.core.bundle.ScoredRows;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.apache.spark.sql.Row;
import org.apache.spark.sql.RowFactory;
import scala.jdk.javaapi.CollectionConverters;

/** One {@link PredictionColumn#TYPE} struct per row, as {@link PressmarkScorer#score} adds it. */
final class StructLayout implements ScoredLayout {

    private static final long serialVersionUID = 1L;

    private final List<String> labels;
    private final String version;

    StructLayout(List<String> labels, String version) {
        this.labels = List.copyOf(labels);
        this.version = version;
    }

    @Override
    public Row row(Row input, ScoredRows scored, int k) {
        Object[] values = new Object[input.length() + 1];
        for (int c = 0; c < input.length(); c++) {
            values[c] = input.get(c);
        }
        if (k >= 0) {
            values[input.length()] = prediction(scored, k);
        }
        return RowFactory.create(values);
    }

    private Row prediction(ScoredRows scored, int k) {
        scala.collection.Map<String, Object> probabilities = null;
        if (scored.hasProbabilities()) {
            Map<String, Object> byLabel = new LinkedHashMap<>(labels.size() * 2);
            for (int l = 0; l < labels.size(); l++) {
                byLabel.put(labels.get(l), scored.probability(k, l));
            }
            // the row encoder reads a map column as a Scala map
            probabilities = CollectionConverters.asScala(byLabel);
        }
        return RowFactory.create(labels.get(scored.label(k)), scored.score(k), probabilities, version);
    }
}
