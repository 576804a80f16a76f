package org.isorisk.spark;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.apache.spark.sql.Row;
import org.apache.spark.sql.SparkSession;
import org.isorisk.engine.book.BookSpec;
import org.isorisk.engine.book.Job;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.io.Csv;
import org.isorisk.engine.io.CsvRow;
import org.isorisk.engine.io.CsvTable;
import org.isorisk.engine.io.Units;
import org.isorisk.engine.model.Status;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * The Spark job in {@code local[2]} inside the build, against the in-process engine on the same files: the same
 * tables, row for row and byte for byte (the engine's book job runs in both; Spark only moves the rows), the
 * Parquet tables with the same values, and the same refusal of a book that cannot be run.
 */
class BookOnSparkTests {

    private static final String SAMPLE = "../sample-data/book/";
    private static SparkSession spark;

    @TempDir
    Path dir;

    @BeforeAll
    static void start() {
        spark = SparkTests.local(2);
    }

    @AfterAll
    static void stop() {
        spark.stop();
    }

    private static BookSpec sample(Job job, boolean json) {
        return new BookSpec(job, SAMPLE + "book.csv", null, null, null, null, SAMPLE + "assumption_sets.csv", null,
                job == Job.STRESS ? "../sample-data/scenarios.yaml" : null, Units.DECIMAL, json);
    }

    private String read(String name) throws IOException {
        return Files.readString(dir.resolve(name), StandardCharsets.UTF_8);
    }

    @Test
    void everyJobWritesTheInProcessTablesRowForRow() throws IOException {
        for (Job job : Job.values()) {
            BookSpec spec = sample(job, false);
            BookOnSpark.Outcome o = BookOnSpark.run(spark, spec, dir.toString(), new BookOnSpark.Options(3, true,
                    false));
            InProcess.Tables expected = InProcess.run(spec);
            assertEquals(expected.results(), read("results.csv"), job.label());
            assertEquals(expected.weights(), read("weights.csv"), job.label());
            if (job != Job.SOLVE) {
                String extra = job == Job.REBALANCE ? "trades.csv" : "stress.csv";
                assertEquals(expected.extra(), read(extra), job.label());
            }
            assertEquals(10, o.summary().count(Status.OPTIMAL));
            CsvTable t = Csv.parse("results.csv", "results", read("results.csv"));
            assertEquals(10, t.rows().size());
        }
    }

    @Test
    void theParquetTablesHoldTheCsvValues() throws IOException {
        BookSpec spec = sample(Job.SOLVE, false);
        BookOnSpark.run(spark, spec, dir.toString(), new BookOnSpark.Options(2, true, true));
        CsvTable csv = Csv.parse("results.csv", "results", read("results.csv"));
        List<Row> parquet = spark.read().parquet(dir.resolve("results.parquet").toString()).orderBy("row")
                .collectAsList();
        assertEquals(csv.rows().size(), parquet.size());
        for (int k = 0; k < parquet.size(); k++) {
            Row p = parquet.get(k);
            CsvRow c = csv.rows().get(k);
            assertEquals(c.cell(csv.column("id")), p.getAs("id"));
            assertEquals(c.cell(csv.column("status")), p.getAs("status"));
            assertEquals(Double.parseDouble(c.cell(csv.column("volatility"))), (double) p.getAs("volatility"));
            assertEquals(Double.parseDouble(c.cell(csv.column("target_variance_per_unit"))),
                    (double) p.getAs("target_variance_per_unit"));
        }
        CsvTable weights = Csv.parse("weights.csv", "weights", read("weights.csv"));
        List<Row> w = spark.read().parquet(dir.resolve("weights.parquet").toString()).collectAsList();
        assertEquals(weights.rows().size(), w.size());
        double csvSum = 0;
        double parquetSum = 0;
        for (CsvRow r : weights.rows()) {
            csvSum += Double.parseDouble(r.cell(2));
        }
        for (Row r : w) {
            parquetSum += r.getDouble(2);
        }
        assertEquals(csvSum, parquetSum, 1e-12);
    }

    @Test
    void badRowsAreRowsWithTheInProcessMessages() throws IOException {
        Files.createDirectories(dir.resolve("in/policies"));
        Files.writeString(dir.resolve("in/policies/p.yaml"), "budget: 1\nbounds:\n  default: {min: 0, max: 0.4}\n");
        Files.writeString(dir.resolve("in/book.csv"), String.join("\n",
                "id,policy,target_return,assumptions,exclude",
                "ok,policies/p.yaml,0.05,base,",
                "missing,policies/none.yaml,0.05,base,",
                "ok,policies/p.yaml,0.05,base,",
                "odd-set,policies/p.yaml,0.05,stres,",
                "too-high,policies/p.yaml,0.5,base,",
                "gold,policies/p.yaml,0.05,base,Gold", ""));
        Files.copy(Path.of(SAMPLE + "assumption_sets.csv"), dir.resolve("in/sets.csv"));
        String sets = dir.resolve("in/sets.csv").toString();
        // the sets file names its files relative to itself: point it at the sample's
        Files.writeString(dir.resolve("in/sets.csv"), "name,expected_returns,covariance\nbase,"
                + Path.of("../sample-data/expected_returns.csv").toAbsolutePath().normalize() + ","
                + Path.of("../sample-data/covariance.csv").toAbsolutePath().normalize() + "\n");
        BookSpec spec = new BookSpec(Job.SOLVE, dir.resolve("in/book.csv").toString(), null, null, null, null, sets,
                null, null, Units.DECIMAL, false);
        Path out = dir.resolve("out");
        BookOnSpark.Outcome o = BookOnSpark.run(spark, spec, out.toString(), new BookOnSpark.Options(4, true, false));
        InProcess.Tables expected = InProcess.run(spec);
        assertEquals(expected.results(), Files.readString(out.resolve("results.csv")));
        assertEquals(1, o.summary().count(Status.OPTIMAL));
        assertEquals(1, o.summary().count(Status.INFEASIBLE));
        assertEquals(4, o.summary().count(Status.INVALID_INPUT));
        assertTrue(Files.readString(out.resolve("results.csv")).contains("the id is also the id of row 2"));
    }

    @Test
    void aBookThatCannotBeRunIsRefusedBeforeAnyWorkWithTheSameMessage() throws IOException {
        Files.writeString(dir.resolve("bad.csv"), "id,polcy,target_return\nx,p.yaml,0.05\n");
        BookSpec spec = new BookSpec(Job.SOLVE, dir.resolve("bad.csv").toString(), null, null, null, null,
                SAMPLE + "assumption_sets.csv", null, null, Units.DECIMAL, false);
        String spark1 = assertThrows(InputException.class, () -> BookOnSpark.run(spark, spec,
                dir.resolve("o").toString(), new BookOnSpark.Options(2, true, false))).getMessage();
        String inProcess = assertThrows(InputException.class, () -> InProcess.run(spec)).getMessage();
        assertEquals(inProcess, spark1);
        assertEquals(dir.resolve("bad.csv") + ": no column named 'policy' in the header (row 1) (value "
                + "'id,polcy,target_return'); fix: did you mean 'polcy'? Name the column policy", spark1);
    }

    @Test
    void theArgumentsAreBatchsOptions() {
        Arguments a = Arguments.parse(new String[] {"--book", "hdfs://c/b.csv", "--job", "rebalance", "--out-dir",
                "hdfs://c/out", "--assumption-sets", "hdfs://c/sets.csv", "--policy", "p.yaml",
                "--partitions", "64", "--format", "parquet", "--units", "percent"});
        assertEquals(Job.REBALANCE, a.spec().job());
        assertEquals("hdfs://c/sets.csv", a.spec().assumptionSets());
        assertEquals(Units.PERCENT, a.spec().units());
        assertEquals(new BookOnSpark.Options(64, false, true), a.options());
        assertTrue(assertThrows(InputException.class, () -> Arguments.parse(new String[] {"--book", "b", "--job",
                "solve", "--out-dir", "o", "--json"})).getMessage().startsWith("--json (each portfolio's JSON) is "
                + "written by isorisk batch"));
        assertEquals("--job 'optimise' is not known; use solve, rebalance or stress; fix: " + Arguments.USAGE,
                assertThrows(InputException.class, () -> Arguments.parse(new String[] {"--book", "b", "--job",
                        "optimise", "--out-dir", "o"})).getMessage());
    }

    static List<String> lines(String text) {
        return new ArrayList<>(List.of(text.split("\n")));
    }
}
