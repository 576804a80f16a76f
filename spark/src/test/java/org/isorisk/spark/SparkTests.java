package org.isorisk.spark;

import org.apache.spark.sql.SparkSession;

/** One Spark session per test class, on loopback and without its web UI (start-up is seconds, done once). */
final class SparkTests {
    private SparkTests() {
    }

    static SparkSession local(int threads) {
        return SparkSession.builder().master("local[" + threads + "]").appName("isorisk-test")
                .config("spark.driver.host", "127.0.0.1")
                .config("spark.driver.bindAddress", "127.0.0.1")
                .config("spark.ui.enabled", "false")
                .config("spark.sql.shuffle.partitions", "4")
                .config("spark.default.parallelism", String.valueOf(threads))
                .getOrCreate();
    }
}
