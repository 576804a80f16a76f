package org.isorisk.spark;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotNull;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import org.apache.spark.SparkConf;
import org.apache.spark.deploy.master.Master$;
import org.apache.spark.deploy.worker.Worker$;
import org.apache.spark.rpc.RpcEnv;
import org.apache.spark.sql.SparkSession;
import org.isorisk.engine.book.BookSpec;
import org.isorisk.engine.book.Job;
import org.isorisk.engine.io.Units;
import org.isorisk.engine.model.Status;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import scala.Option;
import scala.Tuple3;

/**
 * A real standalone cluster on loopback, started from Spark's own classes inside the test: a master and a worker
 * in this JVM, executors in JVMs of their own (so every row, the job and the Hadoop configuration cross a process
 * boundary by serialization). The job's tables equal the in-process engine's, row for row.
 */
class StandaloneClusterTests {

    @TempDir
    Path dir;

    @Test
    void aMasterAndAWorkerOnLoopbackWriteTheInProcessTables() throws IOException {
        String home = System.getenv("SPARK_HOME");
        assertNotNull(home, "surefire sets SPARK_HOME (spark/pom.xml)");
        Files.createDirectories(Path.of(home, "jars"));
        SparkConf conf = new SparkConf().set("spark.ui.enabled", "false").set("spark.master.ui.port", "0")
                .set("spark.worker.ui.port", "0");
        Tuple3<RpcEnv, Object, Option<Object>> master = Master$.MODULE$.startRpcEnvAndEndpoint("127.0.0.1", 0, 0, conf);
        String url = "spark://127.0.0.1:" + master._1().address().port(); // _2 is the web UI's port
        RpcEnv worker = Worker$.MODULE$.startRpcEnvAndEndpoint("127.0.0.1", 0, 0, 2, 2048, new String[] {url},
                dir.resolve("work").toString(), Option.empty(), conf, Option.empty());
        SparkSession spark = SparkSession.builder().master(url).appName("isorisk-standalone-test")
                .config("spark.driver.host", "127.0.0.1")
                .config("spark.driver.bindAddress", "127.0.0.1")
                .config("spark.ui.enabled", "false")
                .config("spark.executor.memory", "512m")
                .config("spark.cores.max", "2")
                .config("spark.executor.extraClassPath", System.getProperty("surefire.test.class.path"))
                .getOrCreate();
        try {
            BookSpec spec = new BookSpec(Job.REBALANCE, "../sample-data/book/book.csv", null, null, null, null,
                    "../sample-data/book/assumption_sets.csv", null, null, Units.DECIMAL, false);
            BookOnSpark.Outcome o = BookOnSpark.run(spark, spec, dir.resolve("out").toString(),
                    new BookOnSpark.Options(4, true, false));
            InProcess.Tables expected = InProcess.run(spec);
            assertEquals(expected.results(), Files.readString(dir.resolve("out/results.csv"), StandardCharsets.UTF_8));
            assertEquals(expected.weights(), Files.readString(dir.resolve("out/weights.csv"), StandardCharsets.UTF_8));
            assertEquals(expected.extra(), Files.readString(dir.resolve("out/trades.csv"), StandardCharsets.UTF_8));
            assertEquals(10, o.summary().count(Status.OPTIMAL));
        } finally {
            spark.stop();
            worker.shutdown();
            master._1().shutdown();
        }
    }
}
