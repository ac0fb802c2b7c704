package dev.pressmark.spark;

import dev.pressmark.core.bundle.Bundle;
import dev.pressmark.core.bundle.Prediction;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import org.apache.spark.broadcast.Broadcast;
import org.apache.spark.sql.Row;
import org.apache.spark.sql.RowFactory;
import org.apache.spark.sql.api.java.UDF1;
import org.apache.spark.sql.api.java.UDF2;
import org.apache.spark.sql.api.java.UDF3;
import org.apache.spark.sql.api.java.UDF4;
import org.apache.spark.sql.api.java.UDF5;
import org.apache.spark.sql.api.java.UDF6;
import org.apache.spark.sql.api.java.UDF7;
import org.apache.spark.sql.api.java.UDF8;

/**
 * Scores one row: the texts of the bundle's input fields in the bundle's order, to a
 * {@link PredictionColumn#TYPE} row. What Spark ships to a task is this object, the broadcast's
 * handle and a few strings; the bundle itself comes from {@link BundleCache}, loaded once per JVM.
 * A null text gives a null result, as SQL functions do.
 */
final class PredictFunction implements UDF1<String, Row>, UDF2<String, String, Row>, UDF3<String, String, String, Row>,
        UDF4<String, String, String, String, Row>, UDF5<String, String, String, String, String, Row>,
        UDF6<String, String, String, String, String, String, Row>, UDF7<String, String, String, String, String, String, String, Row>,
        UDF8<String, String, String, String, String, String, String, String, Row> {

    /** The most input fields one function takes: Spark's Java functions have a fixed number of arguments. */
    static final int MAX_FIELDS = 8;

    private static final long serialVersionUID = 1L;

    private final Broadcast<byte[]> bytes;
    private final String sha256;
    private final String version;
    private final String[] fields;
    private final int maxTokensPerField;
    /** This deserialised copy's bundle: a task asks the JVM-wide cache (and takes its lock) once, not per row. */
    private transient volatile Bundle bundle;

    PredictFunction(Broadcast<byte[]> bytes, String sha256, String version, List<String> fields, int maxTokensPerField) {
        if (fields.isEmpty() || fields.size() > MAX_FIELDS) {
            throw new SparkScoringException(SparkScoringException.TOO_MANY_FIELDS, "the bundle has " + fields.size()
                    + " input fields; a Spark function scores 1 to " + MAX_FIELDS);
        }
        this.bytes = bytes;
        this.sha256 = sha256;
        this.version = version;
        this.fields = fields.toArray(String[]::new);
        this.maxTokensPerField = maxTokensPerField;
    }

    Row score(String... texts) {
        Map<String, String> item = new HashMap<>(texts.length * 2);
        for (int i = 0; i < texts.length; i++) {
            if (texts[i] == null) {
                return null;
            }
            item.put(fields[i], texts[i]);
        }
        Bundle bundle = this.bundle;
        if (bundle == null) {
            bundle = BundleCache.get(sha256, bytes::value);
            this.bundle = bundle;
        }
        Prediction p = bundle.predict(List.of(item), maxTokensPerField).get(0);
        return RowFactory.create(p.label(), p.score(), p.probabilities(), version);
    }

    @Override
    public Row call(String a) {
        return score(a);
    }

    @Override
    public Row call(String a, String b) {
        return score(a, b);
    }

    @Override
    public Row call(String a, String b, String c) {
        return score(a, b, c);
    }

    @Override
    public Row call(String a, String b, String c, String d) {
        return score(a, b, c, d);
    }

    @Override
    public Row call(String a, String b, String c, String d, String e) {
        return score(a, b, c, d, e);
    }

    @Override
    public Row call(String a, String b, String c, String d, String e, String f) {
        return score(a, b, c, d, e, f);
    }

    @Override
    public Row call(String a, String b, String c, String d, String e, String f, String g) {
        return score(a, b, c, d, e, f, g);
    }

    @Override
    public Row call(String a, String b, String c, String d, String e, String f, String g, String h) {
        return score(a, b, c, d, e, f, g, h);
    }
}
