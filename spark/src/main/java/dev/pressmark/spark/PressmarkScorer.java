package dev.pressmark.spark;

import dev.pressmark.core.bundle.Bundle;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.apache.spark.api.java.JavaSparkContext;
import org.apache.spark.broadcast.Broadcast;
import org.apache.spark.sql.Column;
import org.apache.spark.sql.Dataset;
import org.apache.spark.sql.Encoders;
import org.apache.spark.sql.Row;
import org.apache.spark.sql.SparkSession;
import org.apache.spark.sql.api.java.UDF1;
import org.apache.spark.sql.api.java.UDF2;
import org.apache.spark.sql.api.java.UDF3;
import org.apache.spark.sql.api.java.UDF4;
import org.apache.spark.sql.api.java.UDF5;
import org.apache.spark.sql.api.java.UDF6;
import org.apache.spark.sql.api.java.UDF7;
import org.apache.spark.sql.api.java.UDF8;
import org.apache.spark.sql.expressions.UserDefinedFunction;
import org.apache.spark.sql.functions;
import org.apache.spark.sql.types.DataTypes;
import org.apache.spark.sql.types.StringType;
import org.apache.spark.sql.types.StructField;
import org.apache.spark.sql.types.StructType;

/**
 * Scores DataFrames with one bundle. Making a scorer reads the bundle on the driver, checks its
 * checksums (a bundle that fails is refused here, before any task exists), and broadcasts its
 * bytes once; each executor JVM then loads it once. Rows get the numbers of
 * {@code POST /models/{name}/predict}, with the same default cut of
 * {@value #DEFAULT_MAX_TOKENS_PER_FIELD} tokens per field, so a row's label, score and
 * probabilities are the service's, bit for bit. {@link #score} scores each partition a batch of
 * rows at a time ({@code Bundle.score}, as {@code pressmark predict --data} does); {@link #column}
 * and the SQL function, which Spark calls once per row, score one row per call
 * ({@code Bundle.predict}), and so cost more per row.
 *
 * <pre>{@code
 * try (PressmarkScorer scorer = PressmarkScorer.create(spark, BundleSource.store(url, "routing", "v2"))) {
 *     scorer.score(titles).write().parquet(out);
 * }
 * }</pre>
 */
public final class PressmarkScorer implements AutoCloseable {

    /** The SQL function {@link #register} adds unless told another name. */
    public static final String FUNCTION_NAME = "pressmark_predict";
    /** The HTTP service's default cut of each field, so that rows score as its predict endpoint answers them. */
    public static final int DEFAULT_MAX_TOKENS_PER_FIELD = 512;

    private final SparkSession spark;
    private final Broadcast<byte[]> shipped;
    private final String sha256;
    private final String version;
    private final List<String> inputFields;
    private final List<String> labels;
    private final boolean probabilities;
    private final Map<String, String> columns;
    private final int maxTokensPerField;

    private PressmarkScorer(SparkSession spark, Broadcast<byte[]> shipped, String sha256, String version, List<String> inputFields,
            List<String> labels, boolean probabilities, Map<String, String> columns, int maxTokensPerField) {
        this.spark = spark;
        this.shipped = shipped;
        this.sha256 = sha256;
        this.version = version;
        this.inputFields = inputFields;
        this.labels = labels;
        this.probabilities = probabilities;
        this.columns = columns;
        this.maxTokensPerField = maxTokensPerField;
    }

    /** Reads and verifies the bundle on the driver and ships it to the executors of {@code spark}. */
    public static PressmarkScorer create(SparkSession spark, BundleSource source) {
        ResolvedBundle resolved = source.resolve();
        Bundle bundle = resolved.bundle();
        List<String> fields = bundle.inputFields();
        if (fields.size() > PredictFunction.MAX_FIELDS) {
            throw new SparkScoringException(SparkScoringException.TOO_MANY_FIELDS, source + ": the bundle has " + fields.size()
                    + " input fields; a Spark function scores at most " + PredictFunction.MAX_FIELDS);
        }
        Broadcast<byte[]> shipped = JavaSparkContext.fromSparkContext(spark.sparkContext()).broadcast(resolved.bytes());
        Map<String, String> identity = new LinkedHashMap<>();
        fields.forEach(field -> identity.put(field, field));
        return new PressmarkScorer(spark, shipped, resolved.sha256(), resolved.version(), List.copyOf(fields),
                List.copyOf(bundle.labels()), bundle.hasProbabilities(), identity,
                DEFAULT_MAX_TOKENS_PER_FIELD);
    }

    /**
     * A scorer that reads input field {@code field} from the column {@code column}; fields not
     * mapped are read from the column of their own name. Shares this scorer's shipped bundle.
     */
    public PressmarkScorer withColumn(String field, String column) {
        if (!inputFields.contains(field)) {
            throw new SparkScoringException(SparkScoringException.UNKNOWN_FIELD, "\"" + field
                    + "\" is not an input field of the bundle; its fields are " + inputFields);
        }
        Map<String, String> mapped = new LinkedHashMap<>(columns);
        mapped.put(field, column);
        return new PressmarkScorer(spark, shipped, sha256, version, inputFields, labels, probabilities, mapped, maxTokensPerField);
    }

    /** A scorer that cuts each field to its first {@code tokens} tokens (the HTTP service's {@code --max-tokens-per-field}). */
    public PressmarkScorer withMaxTokensPerField(int tokens) {
        if (tokens < 1) {
            throw new IllegalArgumentException("maxTokensPerField must be >= 1 tokens, was " + tokens);
        }
        return new PressmarkScorer(spark, shipped, sha256, version, inputFields, labels, probabilities, columns, tokens);
    }

    /** {@code frame} with a {@link PredictionColumn#DEFAULT_NAME} column added. */
    public Dataset<Row> score(Dataset<Row> frame) {
        return score(frame, PredictionColumn.DEFAULT_NAME);
    }

    /**
     * {@code frame} with a column {@code name} of type {@link PredictionColumn#TYPE} added. Fails at
     * once, naming the column, when a mapped column is missing or does not hold text, or when
     * {@code name} is taken.
     */
    public Dataset<Row> score(Dataset<Row> frame, String name) {
        if (Arrays.asList(frame.columns()).contains(name)) {
            throw new IllegalArgumentException("the DataFrame already has a column \"" + name + "\"; name the prediction column otherwise");
        }
        StructType scored = frame.schema().add(name, PredictionColumn.TYPE, true);
        return frame.mapPartitions(new PartitionScorer(shipped, sha256, new StructLayout(labels, version), inputColumns(frame),
                maxTokensPerField), Encoders.row(scored));
    }

    /**
     * {@code frame} scored as the lines of a CSV file: one text column, each row the input's values
     * then {@code label}, {@code score}, {@code p:<label>} per label when the model gives
     * probabilities, and {@code version}, as {@link CsvLineLayout} writes them; the header line
     * starts each non-empty partition and the first one. Fails at once when {@code frame} already has one of
     * the columns the prediction adds.
     */
    Dataset<Row> scoreAsCsvLines(Dataset<Row> frame) {
        int[] inputColumns = inputColumns(frame);
        List<String> names = Arrays.asList(frame.columns());
        for (String added : CsvLineLayout.predictionColumns(labels, probabilities)) {
            if (names.contains(added)) {
                throw new IllegalArgumentException("the input already has a column \"" + added
                        + "\", which the CSV output adds; rename it or write parquet");
            }
        }
        CsvLineLayout layout = new CsvLineLayout(names, labels, probabilities, version);
        StructType line = new StructType().add("value", DataTypes.StringType, false);
        return frame.mapPartitions(new PartitionScorer(shipped, sha256, layout, inputColumns, maxTokensPerField), Encoders.row(line));
    }

    /** Per input field of the bundle, in its order, the index in {@code frame} of the text column it is read from. */
    private int[] inputColumns(Dataset<Row> frame) {
        int[] inputColumns = new int[inputFields.size()];
        for (int f = 0; f < inputColumns.length; f++) {
            String column = columns.get(inputFields.get(f));
            requireTextColumn(frame, inputFields.get(f), column);
            inputColumns[f] = frame.schema().fieldIndex(column);
        }
        return inputColumns;
    }

    /** The prediction of each row of {@code frame}, as a column to select or add. */
    public Column column(Dataset<Row> frame) {
        List<Column> inputs = new ArrayList<>(inputFields.size());
        for (String field : inputFields) {
            String column = columns.get(field);
            requireTextColumn(frame, field, column);
            inputs.add(frame.col(quoted(column)));
        }
        return function().apply(inputs.toArray(Column[]::new));
    }

    /**
     * Registers {@code pressmark_predict(FIELD1, ...)} on the session: it takes the texts of the
     * bundle's input fields in the bundle's order ({@link #inputFields}) and returns the
     * {@link PredictionColumn#TYPE} struct.
     */
    public void register() {
        register(FUNCTION_NAME);
    }

    /** Registers the SQL function under {@code name}. */
    public void register(String name) {
        spark.udf().register(name, function());
    }

    /** The bundle's input fields, in the order the SQL function takes them. */
    public List<String> inputFields() {
        return inputFields;
    }

    /** The bundle's labels, in the order its probabilities list them. */
    public List<String> labels() {
        return labels;
    }

    /** Whether the rows' {@code probabilities} are filled in (the bundle was trained with them), or null. */
    public boolean hasProbabilities() {
        return probabilities;
    }

    /** The version the scored rows carry: the store tag, or {@code sha256:HEX} for a file. */
    public String version() {
        return version;
    }

    /** The SHA-256 of the shipped bundle bytes. */
    public String sha256() {
        return sha256;
    }

    /** Removes the shipped bundle from the executors; DataFrames scored by this scorer can no longer be computed. */
    @Override
    public void close() {
        shipped.destroy();
    }

    private UserDefinedFunction function() {
        PredictFunction f = new PredictFunction(shipped, sha256, version, inputFields, maxTokensPerField);
        UserDefinedFunction udf = switch (inputFields.size()) {
            case 1 -> functions.udf((UDF1<?, ?>) f, PredictionColumn.TYPE);
            case 2 -> functions.udf((UDF2<?, ?, ?>) f, PredictionColumn.TYPE);
            case 3 -> functions.udf((UDF3<?, ?, ?, ?>) f, PredictionColumn.TYPE);
            case 4 -> functions.udf((UDF4<?, ?, ?, ?, ?>) f, PredictionColumn.TYPE);
            case 5 -> functions.udf((UDF5<?, ?, ?, ?, ?, ?>) f, PredictionColumn.TYPE);
            case 6 -> functions.udf((UDF6<?, ?, ?, ?, ?, ?, ?>) f, PredictionColumn.TYPE);
            case 7 -> functions.udf((UDF7<?, ?, ?, ?, ?, ?, ?, ?>) f, PredictionColumn.TYPE);
            default -> functions.udf((UDF8<?, ?, ?, ?, ?, ?, ?, ?, ?>) f, PredictionColumn.TYPE);
        };
        return udf.withName(FUNCTION_NAME);
    }

    private static void requireTextColumn(Dataset<Row> frame, String field, String column) {
        StructField found = null;
        for (StructField candidate : frame.schema().fields()) {
            if (candidate.name().equals(column)) {
                found = candidate;
            }
        }
        String forField = column.equals(field) ? "" : " (mapped to the bundle's input field \"" + field + "\")";
        if (found == null) {
            throw new SparkScoringException(SparkScoringException.MISSING_COLUMN, "the DataFrame has no column \"" + column + "\""
                    + forField + " for the bundle's input field \"" + field + "\"; its columns are "
                    + String.join(", ", frame.columns()) + " (withColumn(FIELD, COLUMN) maps a field to another column)");
        }
        if (!(found.dataType() instanceof StringType)) {
            throw new SparkScoringException(SparkScoringException.NOT_TEXT, "column \"" + column + "\"" + forField + " is "
                    + found.dataType().simpleString() + ", not string; cast it to string to score it");
        }
    }

    /** A column name as {@code Dataset.col} reads it literally, dots and all. */
    private static String quoted(String column) {
        return "`" + column.replace("`", "``") + "`";
    }
}
