package org.isorisk.engine.batch;

/**
 * How a run is cut up.
 *
 * @param parallelism how many batches may run at once: the number of threads of the executor given; at most
 *                    {@code 2 × parallelism + 1} batches are in flight, so memory stays flat in the number of jobs
 * @param batchSize   jobs per task handed to the executor (default {@value #DEFAULT_BATCH}: enough to make the
 *                    hand-off between threads cheap beside the jobs, few enough to keep every thread busy)
 * @param chunkSize   jobs per chunk delivered to the sink, the unit a caller commits (default
 *                    {@value #DEFAULT_CHUNK}); the last chunk may be smaller
 * @param total       the number of jobs when known in advance (for the time left), else -1
 */
public record BatchSettings(int parallelism, int batchSize, int chunkSize, long total) {
    /** Default jobs per task. */
    public static final int DEFAULT_BATCH = 64;
    /** Default jobs per delivered chunk. */
    public static final int DEFAULT_CHUNK = 4096;

    public BatchSettings {
        if (parallelism < 1 || batchSize < 1 || chunkSize < 1) {
            throw new IllegalArgumentException("parallelism, batch size and chunk size must be at least 1");
        }
    }

    /** The defaults for {@code parallelism} threads and an unknown total. */
    public static BatchSettings of(int parallelism) {
        return new BatchSettings(parallelism, DEFAULT_BATCH, DEFAULT_CHUNK, -1);
    }

    public BatchSettings withChunkSize(int size) {
        return new BatchSettings(parallelism, batchSize, size, total);
    }

    public BatchSettings withBatchSize(int size) {
        return new BatchSettings(parallelism, size, chunkSize, total);
    }

    public BatchSettings withTotal(long t) {
        return new BatchSettings(parallelism, batchSize, chunkSize, t);
    }
}
