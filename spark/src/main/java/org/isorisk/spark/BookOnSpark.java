package org.isorisk.spark;

import java.io.IOException;
import java.io.InputStream;
import java.io.ObjectInputStream;
import java.io.ObjectOutputStream;
import java.io.OutputStream;
import java.io.Serializable;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.Iterator;
import java.util.List;
import java.util.Map;
import java.util.concurrent.ConcurrentHashMap;
import org.apache.hadoop.conf.Configuration;
import org.apache.hadoop.fs.FileStatus;
import org.apache.hadoop.fs.FileSystem;
import org.apache.hadoop.fs.Path;
import org.apache.spark.api.java.JavaRDD;
import org.apache.spark.api.java.JavaSparkContext;
import org.apache.spark.sql.Dataset;
import org.apache.spark.sql.Row;
import org.apache.spark.sql.RowFactory;
import org.apache.spark.sql.SaveMode;
import org.apache.spark.sql.SparkSession;
import org.apache.spark.sql.functions;
import org.apache.spark.sql.types.DataType;
import org.apache.spark.sql.types.DataTypes;
import org.apache.spark.sql.types.StructField;
import org.apache.spark.sql.types.StructType;
import org.apache.spark.storage.StorageLevel;
import org.isorisk.engine.book.Book;
import org.isorisk.engine.book.BookJob;
import org.isorisk.engine.book.BookRow;
import org.isorisk.engine.book.BookSpec;
import org.isorisk.engine.book.BookSummary;
import org.isorisk.engine.book.BookTables;
import org.isorisk.engine.book.PortfolioResult;
import org.isorisk.engine.explain.Caution;
import org.isorisk.engine.io.InputFile;
import org.isorisk.engine.model.Status;

/**
 * The book job on Apache Spark. The driver checks the book (one streaming pass: columns, well-formed rows, repeated
 * ids) and the run's shared inputs, exactly as {@code isorisk batch} does, so that a book that cannot be run stops
 * before any work. One task then streams the book's rows (the engine's own reader, through a Hadoop file system),
 * they are spread over the partitions, and each partition runs the engine's {@link BookJob} on its rows (one job per
 * executor JVM, opened once: the assumptions read and factored once). The results are sorted back into book order
 * and written as the same CSV tables the in-process engine writes, byte for byte ({@code results.csv},
 * {@code weights.csv}, {@code trades.csv} or {@code stress.csv}), as Parquet
 * ({@code results.parquet}, {@code weights.parquet}) and a {@code summary.json}.
 *
 * <p>Rows travel between JVMs as plain serializable objects and Spark {@link Row}s with an explicit schema, never as
 * Java records (Kryo 4 and {@code Encoders.bean} cannot take records).
 */
public final class BookOnSpark {
    private BookOnSpark() {
    }

    /**
     * How to run.
     *
     * @param partitions partitions the rows are spread over (0: Spark's default parallelism)
     * @param csv        write the CSV tables
     * @param parquet    write the Parquet tables
     */
    public record Options(int partitions, boolean csv, boolean parquet) implements Serializable {
        private static final long serialVersionUID = 1L;
    }

    /**
     * What a run did.
     *
     * @param summary the portfolios counted by status
     * @param files   the files written in the output folder
     */
    public record Outcome(BookSummary summary, List<String> files) {
    }

    /** One book row on its way to a partition (a plain serializable object). */
    static final class Input implements Serializable {
        private static final long serialVersionUID = 1L;
        final long index;
        final int row;
        final String[] cells;
        final int duplicateOf;

        Input(BookRow r) {
            this.index = r.index();
            this.row = r.row();
            this.cells = r.cells().toArray(new String[0]);
            this.duplicateOf = r.duplicateOf();
        }

        BookRow row() {
            return new BookRow(index, row, Arrays.asList(cells), duplicateOf);
        }
    }

    /** What every task needs: the spec, the book's header, and the Hadoop configuration to open files with. */
    static final class Plan implements Serializable {
        private static final long serialVersionUID = 1L;
        final BookSpec spec;
        final List<String> header;
        final int headerRow;
        /** The spec's paths qualified on the driver (executors run in other folders, maybe on other machines). */
        final Map<String, String> locations;
        private transient Configuration conf;

        Plan(BookSpec spec, List<String> header, int headerRow, Configuration conf) {
            this.spec = spec;
            this.header = List.copyOf(header);
            this.headerRow = headerRow;
            this.conf = conf;
            Map<String, String> at = new java.util.HashMap<>();
            for (String p : new String[] {spec.book(), spec.expectedReturns(), spec.covariance(), spec.volatilities(),
                    spec.correlation(), spec.assumptionSets(), spec.policy(), spec.scenarios()}) {
                if (p != null) {
                    at.put(p, HadoopFile.qualified(p, conf).location());
                }
            }
            this.locations = Map.copyOf(at);
        }

        InputFile file(String path) {
            return new HadoopFile(path, locations.getOrDefault(path, path), conf);
        }

        /** The key of the job kept per JVM: the spec and the header (the same run). */
        List<Object> key() {
            return List.of(spec, header);
        }

        private void writeObject(ObjectOutputStream out) throws IOException {
            out.defaultWriteObject();
            conf.write(out);
        }

        private void readObject(ObjectInputStream in) throws IOException, ClassNotFoundException {
            in.defaultReadObject();
            conf = new Configuration(false);
            conf.readFields(in);
        }
    }

    /** The book job of each run, opened once per JVM (the executors' tasks share it; it is thread-safe). */
    private static final Map<List<Object>, BookJob> JOBS = new ConcurrentHashMap<>();

    private static BookJob job(Plan plan) {
        return JOBS.computeIfAbsent(plan.key(), k -> BookJob.open(plan.spec,
                new org.isorisk.engine.book.BookColumns(plan.spec.book(), plan.header, plan.headerRow),
                plan::file, true));
    }

    /** The schema of the computed rows: position, the CSV texts, the typed results and the weights. */
    static StructType schema() {
        List<StructField> f = new ArrayList<>();
        f.add(DataTypes.createStructField("index", DataTypes.LongType, false));
        f.add(DataTypes.createStructField("_results", DataTypes.StringType, false));
        f.add(DataTypes.createStructField("_weights", DataTypes.StringType, false));
        f.add(DataTypes.createStructField("_extra", DataTypes.StringType, false));
        for (BookTables.Column c : BookTables.RESULTS.columns()) {
            f.add(DataTypes.createStructField(c.name(), type(c.kind()), true));
        }
        StructType w = new StructType(new StructField[] {
                DataTypes.createStructField("asset", DataTypes.StringType, false),
                DataTypes.createStructField("weight", DataTypes.DoubleType, true)});
        f.add(DataTypes.createStructField("_weight_values", DataTypes.createArrayType(w, false), false));
        return DataTypes.createStructType(f);
    }

    private static DataType type(BookTables.Kind k) {
        return switch (k) {
            case TEXT -> DataTypes.StringType;
            case NUMBER -> DataTypes.DoubleType;
            case INTEGER -> DataTypes.LongType;
            case BOOLEAN -> DataTypes.BooleanType;
        };
    }

    /** A result as a Spark row of {@link #schema()}. */
    static Row row(PortfolioResult r) {
        List<Object> v = new ArrayList<>();
        v.add(r.index());
        v.add(chop(r.resultLine()));
        v.add(chop(r.weightLines()));
        v.add(chop(r.extraLines()));
        for (Object o : r.values()) {
            v.add(o instanceof Double d && d.isNaN() ? null : o);
        }
        List<Row> weights = new ArrayList<>();
        for (Object[] w : r.weights()) {
            Double x = (Double) w[2];
            weights.add(RowFactory.create(w[1], x.isNaN() ? null : x));
        }
        v.add(scala.jdk.javaapi.CollectionConverters.asScala(weights)); // an array column takes a Scala Seq
        return RowFactory.create(v.toArray());
    }

    /** Text without its final line end (Spark's text writer adds one per row). */
    private static String chop(String s) {
        return s.endsWith("\n") ? s.substring(0, s.length() - 1) : s;
    }

    /**
     * Runs the book job over {@code spec}'s book and writes the tables into {@code outDir} (a Hadoop path; created,
     * and its tables replaced).
     *
     * @throws org.isorisk.engine.error.InputException when the book or the run's shared inputs cannot be used
     */
    public static Outcome run(SparkSession spark, BookSpec spec, String outDir, Options options) {
        Configuration conf = spark.sparkContext().hadoopConfiguration();
        Book book = Book.scan(new HadoopFile(spec.book(), conf));
        BookJob.open(spec, book.columns(), p -> new HadoopFile(p, conf), false); // the shared inputs, checked here
        Plan plan = new Plan(spec, book.columns().header(), headerRow(spec, conf), conf);
        JavaSparkContext jsc = JavaSparkContext.fromSparkContext(spark.sparkContext());
        int partitions = options.partitions() > 0 ? options.partitions() : jsc.defaultParallelism();
        JavaRDD<Input> rows = jsc.parallelize(List.of(0), 1).flatMap(x -> read(plan));
        JavaRDD<Row> results = rows.repartition(partitions).mapPartitions(it -> {
            BookJob job = job(plan);
            return new Iterator<Row>() {
                @Override
                public boolean hasNext() {
                    return it.hasNext();
                }

                @Override
                public Row next() {
                    return row(job.apply(it.next().row()));
                }
            };
        });
        Dataset<Row> computed = spark.createDataFrame(results, schema()).persist(StorageLevel.MEMORY_AND_DISK());
        try {
            Dataset<Row> sorted = computed.sort("index");
            List<String> files = new ArrayList<>();
            FileSystem fs = fileSystem(outDir, conf);
            Path out = new Path(outDir);
            fs.mkdirs(out);
            if (options.csv()) {
                csv(sorted, "_results", BookTables.RESULTS.header(), out, BookTables.RESULTS.file(), fs, files);
                csv(sorted, "_weights", BookTables.WEIGHTS.header(), out, BookTables.WEIGHTS.file(), fs, files);
                for (BookTables.Table t : BookTables.extra(spec.job())) {
                    csv(sorted, "_extra", t.header(), out, t.file(), fs, files);
                }
            }
            if (options.parquet()) {
                List<org.apache.spark.sql.Column> cols = new ArrayList<>();
                for (BookTables.Column c : BookTables.RESULTS.columns()) {
                    cols.add(functions.col(c.name()));
                }
                sorted.select(cols.toArray(new org.apache.spark.sql.Column[0])).write().mode(SaveMode.Overwrite)
                        .parquet(new Path(out, "results.parquet").toString());
                files.add("results.parquet");
                sorted.select(functions.col("index"), functions.col("id"),
                                functions.explode(functions.col("_weight_values")).as("w"))
                        .select(functions.col("id"), functions.col("w.asset").as("asset"),
                                functions.col("w.weight").as("weight"))
                        .write().mode(SaveMode.Overwrite).parquet(new Path(out, "weights.parquet").toString());
                files.add("weights.parquet");
            }
            long[] counts = new long[Status.values().length];
            for (Row r : computed.groupBy("status").count().collectAsList()) {
                for (Status s : Status.values()) {
                    if (s.label().equals(r.getString(0))) {
                        counts[s.ordinal()] = r.getLong(1);
                    }
                }
            }
            java.util.EnumMap<Status, Long> m = new java.util.EnumMap<>(Status.class);
            for (Status s : Status.values()) {
                m.put(s, counts[s.ordinal()]);
            }
            BookSummary summary = new BookSummary(m);
            writeSummary(fs, new Path(out, "summary.json"), spec, book, summary, files, partitions);
            files.add("summary.json");
            return new Outcome(summary, files);
        } catch (IOException e) {
            throw new UncheckedIOException("cannot write " + outDir, e);
        } finally {
            computed.unpersist();
        }
    }

    private static int headerRow(BookSpec spec, Configuration conf) {
        try (org.isorisk.engine.io.CsvStream s = org.isorisk.engine.io.Csv.stream(new HadoopFile(spec.book(), conf),
                "book")) {
            return s.headerRow();
        }
    }

    /** The book's rows, streamed by one task (its iterator closes the file at the end). */
    private static Iterator<Input> read(Plan plan) {
        Book book = Book.scan(plan.file(plan.spec.book()));
        Book.Rows rows = book.rows();
        return new Iterator<>() {
            @Override
            public boolean hasNext() {
                boolean more = rows.hasNext();
                if (!more) {
                    rows.close();
                }
                return more;
            }

            @Override
            public Input next() {
                return new Input(rows.next());
            }
        };
    }

    /**
     * Writes one text column of the sorted rows as a single file {@code out/name}: Spark writes part files in sort
     * order into a temporary folder, then they are joined behind the header on the driver.
     */
    private static void csv(Dataset<Row> sorted, String column, String header, Path out, String name, FileSystem fs,
                            List<String> files) throws IOException {
        Path parts = new Path(out, "_" + name + ".parts");
        sorted.select(column).filter(functions.length(functions.col(column)).gt(0)).write().mode(SaveMode.Overwrite)
                .text(parts.toString());
        Path target = new Path(out, name);
        Path temp = new Path(out, "." + name + ".tmp");
        FileStatus[] all = fs.listStatus(parts, p -> p.getName().startsWith("part-"));
        Arrays.sort(all, (a, b) -> a.getPath().getName().compareTo(b.getPath().getName()));
        try (OutputStream o = fs.create(temp, true)) {
            o.write(header.getBytes(StandardCharsets.UTF_8));
            for (FileStatus f : all) {
                try (InputStream in = fs.open(f.getPath())) {
                    in.transferTo(o);
                }
            }
        }
        fs.delete(target, false);
        if (!fs.rename(temp, target)) {
            throw new IOException("cannot rename " + temp + " to " + target);
        }
        fs.delete(parts, true);
        files.add(name);
    }

    private static void writeSummary(FileSystem fs, Path target, BookSpec spec, Book book, BookSummary summary,
                                     List<String> files, int partitions) throws IOException {
        var o = new com.fasterxml.jackson.databind.ObjectMapper().createObjectNode();
        o.put("status", summary.worst().label());
        o.put("job", spec.job().label());
        var b = o.putObject("book");
        b.put("name", new HadoopFile(spec.book(), fs.getConf()).name());
        b.put("sha256", book.sha256());
        b.put("portfolios", book.size());
        var c = o.putObject("counts");
        for (Status s : Status.values()) {
            c.put(s.label(), summary.count(s));
        }
        o.put("partitions", partitions);
        var f = o.putArray("files");
        files.forEach(f::add);
        o.put("caution", Caution.TEXT);
        try (OutputStream out = fs.create(target, true)) {
            out.write((new com.fasterxml.jackson.databind.ObjectMapper().writerWithDefaultPrettyPrinter()
                    .writeValueAsString(o) + "\n").getBytes(StandardCharsets.UTF_8));
        }
    }

    private static FileSystem fileSystem(String dir, Configuration conf) throws IOException {
        return new Path(dir).getFileSystem(conf);
    }

    /** Asks a whole book's count of rows without running it (tests). */
    static long rows(BookSpec spec, Configuration conf) {
        return Book.scan(new HadoopFile(spec.book(), conf)).size();
    }

    /**
     * The entry point for {@code spark-submit}: the options of {@code isorisk batch} (see {@link Arguments}); exits
     * 0 when every portfolio is optimal, 3 when some have no solution, 2 when some had invalid input or the run
     * could not start.
     */
    public static void main(String[] args) {
        int code;
        try {
            Arguments a = Arguments.parse(args);
            SparkSession spark = SparkSession.builder().appName("isorisk book " + a.spec().job().label())
                    .getOrCreate();
            try {
                long t0 = System.nanoTime();
                Outcome o = run(spark, a.spec(), a.outDir(), a.options());
                System.out.println(Arguments.summary(a, o, (System.nanoTime() - t0) / 1e9));
                Status worst = o.summary().worst();
                code = worst == Status.OPTIMAL ? 0 : worst == Status.INVALID_INPUT ? 2 : 3;
            } finally {
                spark.stop();
            }
        } catch (org.isorisk.engine.error.IsoriskException e) {
            System.err.println("isorisk: error: " + e.getMessage());
            code = 2;
        }
        System.exit(code);
    }
}
