package dev.pressmark.spark;

import java.nio.file.Path;
import java.util.concurrent.atomic.AtomicInteger;
import org.apache.spark.scheduler.SparkListener;
import org.apache.spark.scheduler.SparkListenerTaskStart;
import org.apache.spark.sql.SparkSession;

/**
 * The tests' Spark: local mode on two threads, bound to the loopback, no web UI, few shuffle
 * partitions; one per test class, since starting one costs seconds.
 */
final class LocalSpark {

    private LocalSpark() {
    }

    static SparkSession start(Path warehouse) {
        return SparkSession.builder()
                .master("local[2]")
                .appName("pressmark-test")
                .config("spark.driver.host", "127.0.0.1")
                .config("spark.driver.bindAddress", "127.0.0.1")
                .config("spark.ui.enabled", "false")
                .config("spark.sql.shuffle.partitions", "4")
                .config("spark.sql.warehouse.dir", warehouse.toString())
                .getOrCreate();
    }

    /** Counts every task Spark starts on {@code spark} from now on. */
    static AtomicInteger countTasks(SparkSession spark) {
        AtomicInteger started = new AtomicInteger();
        spark.sparkContext().addSparkListener(new SparkListener() {
            @Override
            public void onTaskStart(SparkListenerTaskStart taskStart) {
                started.incrementAndGet();
            }
        });
        return started;
    }
}
