package dev.pressmark.spark;

import org.apache.spark.sql.types.DataTypes;
import org.apache.spark.sql.types.StructField;
import org.apache.spark.sql.types.StructType;

/** The struct a scored row gets: the fields of one result of {@code POST /models/{name}/predict}, and the version. */
public final class PredictionColumn {

    /** The column {@link PressmarkScorer#score} adds unless told another name. */
    public static final String DEFAULT_NAME = "prediction";
    public static final String LABEL = "label";
    public static final String SCORE = "score";
    /** Each label's probability; null when the model gives none. */
    public static final String PROBABILITIES = "probabilities";
    /** The store tag, or {@code sha256:HEX} for a bundle read from a file. */
    public static final String VERSION = "version";

    /** {@code struct<label: string, score: double, probabilities: map<string, double>, version: string>}. */
    public static final StructType TYPE = new StructType(new StructField[] {
        DataTypes.createStructField(LABEL, DataTypes.StringType, false),
        DataTypes.createStructField(SCORE, DataTypes.DoubleType, false),
        DataTypes.createStructField(PROBABILITIES, DataTypes.createMapType(DataTypes.StringType, DataTypes.DoubleType, false), true),
        DataTypes.createStructField(VERSION, DataTypes.StringType, false),
    });

    private PredictionColumn() {
    }
}
