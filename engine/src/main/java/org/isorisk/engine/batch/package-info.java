/**
 * Many independent jobs on a caller's executor, with their results handed back in input order:
 * {@link org.isorisk.engine.batch.BatchRunner}. Work is read on the calling thread, run in small batches on the
 * executor's threads (the caller's pool: the runner never creates threads of its own), and delivered in complete
 * chunks, in input order, to a sink and to a reduction that runs on the calling thread, so that every total is the
 * same on any number of threads. Progress (count, rate, time left) and cancellation are callbacks. No I/O here:
 * what a chunk becomes (files, a Spark partition) is the caller's business.
 */
package org.isorisk.engine.batch;
