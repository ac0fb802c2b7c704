package dev.pressmark.spark;

import dev.pressmark.core.PressmarkException;
import dev.pressmark.store.BundleStore;
import java.io.IOException;
import java.io.PrintStream;
import org.apache.hadoop.fs.FileSystem;
import org.apache.spark.sql.Dataset;
import org.apache.spark.sql.Row;
import org.apache.spark.sql.SparkSession;

/**
 * The job {@code spark-submit} runs: reads a table, scores it with a stored version and writes
 * the table with a {@code prediction} column (Parquet) or with {@code label}, {@code score},
 * {@code p:<label>} and {@code version} columns (CSV, which holds no structs). Exit codes as the
 * {@code pressmark} command's: 0 done, 1 a failure you can fix (one line on stderr), 2 a usage error.
 */
public final class ScoreJob {

    static final String USAGE = """
            usage: spark-submit --class dev.pressmark.spark.ScoreJob pressmark-spark.jar \\
                     --model NAME[:TAG] --store URL --input PATH --output PATH [--format parquet|csv] \\
                     [--column FIELD=COLUMN]... [--max-tokens-per-field N]
              --model   the stored model, its active version unless :TAG is given
              --store   sqlite:PATH or jdbc:postgresql://HOST[:PORT]/DATABASE (default: env PRESSMARK_STORE)
              --input   the table to score, in --format; CSV (RFC 4180 quotes) needs a header row and no line break inside a field
              --output  where the scored table goes, in --format; it must not exist
              --format  parquet (default) or csv
              --column  read the bundle's input field FIELD from COLUMN (default: the column named FIELD)
              --max-tokens-per-field  tokens of each field that are scored (default 512, as the HTTP service)""";

    /**
     * RFC 4180 quoting, as {@code pressmark predict --data} reads it: a quote inside a quoted field
     * is doubled. Spark's CSV default escapes it with a backslash instead, and so splits
     * {@code "a ""b"", c"} into two fields. The output is written as lines of text
     * ({@link CsvLineLayout}), quoted as {@code predict --data} quotes them.
     */
    private static final String CSV_QUOTE = "\"";

    private ScoreJob() {
    }

    public static void main(String[] args) {
        ScoreOptions options;
        try {
            options = ScoreOptions.parse(args, System.getenv(BundleStore.URL_ENV));
        } catch (IllegalArgumentException e) {
            System.err.println("pressmark score: " + e.getMessage());
            System.err.println(USAGE);
            System.exit(2);
            return;
        }
        SparkSession spark = SparkSession.builder().appName("pressmark score " + options.model()).getOrCreate();
        int code;
        try {
            code = run(spark, options, System.err);
        } finally {
            spark.stop();
        }
        if (code != 0) {
            System.exit(code);
        }
    }

    /** Runs the job on {@code spark}; errors go to {@code err} as one line. Returns the exit code. */
    static int run(SparkSession spark, ScoreOptions options, PrintStream err) {
        try {
            requireAbsent(spark, options.output());
            PressmarkScorer scorer = PressmarkScorer.create(spark, BundleSource.store(options.store(), options.model()))
                    .withMaxTokensPerField(options.maxTokensPerField());
            for (var mapping : options.columns().entrySet()) {
                scorer = scorer.withColumn(mapping.getKey(), mapping.getValue());
            }
            try (PressmarkScorer closing = scorer) {
                Dataset<Row> input = read(spark, options);
                if (options.format() == ScoreOptions.Format.CSV) {
                    closing.scoreAsCsvLines(input).write().text(options.output());
                    nameAsCsv(spark, options.output());
                } else {
                    closing.score(input).write().parquet(options.output());
                }
            }
            return 0;
        } catch (PressmarkException | IllegalArgumentException e) {
            err.println("pressmark score: " + e.getMessage());
            return 1;
        } catch (RuntimeException e) {
            err.println("pressmark score: " + firstLine(e));
            return 1;
        }
    }

    private static Dataset<Row> read(SparkSession spark, ScoreOptions options) {
        return options.format() == ScoreOptions.Format.CSV
                ? spark.read().option("header", "true").option("escape", CSV_QUOTE).csv(options.input())
                : spark.read().parquet(options.input());
    }

    private static void requireAbsent(SparkSession spark, String output) {
        org.apache.hadoop.fs.Path path = new org.apache.hadoop.fs.Path(output);
        try {
            FileSystem fs = path.getFileSystem(spark.sparkContext().hadoopConfiguration());
            if (fs.exists(path)) {
                throw new IllegalArgumentException("--output " + output + " exists; give a path that does not (nothing was written)");
            }
        } catch (IOException e) {
            throw new IllegalArgumentException("--output " + output + ": cannot check it: " + e.getMessage(), e);
        }
    }

    /**
     * Spark's text writer names its part files {@code .txt} and has no option for another
     * extension; the job's lines are CSV, so once the output is complete its part files are
     * renamed to {@code .csv}. A rename that fails leaves the file as it was and says which.
     */
    private static void nameAsCsv(SparkSession spark, String output) {
        org.apache.hadoop.fs.Path dir = new org.apache.hadoop.fs.Path(output);
        try {
            FileSystem fs = dir.getFileSystem(spark.sparkContext().hadoopConfiguration());
            for (org.apache.hadoop.fs.FileStatus file : fs.listStatus(dir)) {
                String name = file.getPath().getName();
                if (name.startsWith("part-") && name.endsWith(".txt")) {
                    org.apache.hadoop.fs.Path csv = new org.apache.hadoop.fs.Path(dir, name.substring(0, name.length() - 4) + ".csv");
                    if (!fs.rename(file.getPath(), csv)) {
                        throw new IllegalArgumentException("--output " + output + ": written, but " + name + " could not be renamed to "
                                + csv.getName());
                    }
                }
            }
        } catch (IOException e) {
            throw new IllegalArgumentException("--output " + output + ": written, but its part files could not be renamed to .csv: "
                    + e.getMessage(), e);
        }
    }

    /** Spark's own messages can run to a plan of many lines; the first says what went wrong. */
    private static String firstLine(Throwable e) {
        String message = e.getMessage();
        if (message == null || message.isBlank()) {
            return e.getClass().getSimpleName();
        }
        int newline = message.indexOf('\n');
        return (newline < 0 ? message : message.substring(0, newline)).strip();
    }
}
