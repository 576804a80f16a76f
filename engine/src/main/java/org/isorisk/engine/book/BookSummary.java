package org.isorisk.engine.book;

import java.util.EnumMap;
import java.util.Map;
import org.isorisk.engine.batch.BatchRunner;
import org.isorisk.engine.model.Status;

/**
 * Counts of a run's portfolios by status, folded in book order by {@link BookRunner} (the same on any number of
 * threads). Immutable.
 *
 * @param counts portfolios per status (every status present, zero when none)
 */
public record BookSummary(Map<Status, Long> counts) {
    public BookSummary {
        EnumMap<Status, Long> all = new EnumMap<>(Status.class);
        for (Status s : Status.values()) {
            all.put(s, counts.getOrDefault(s, 0L));
        }
        counts = java.util.Collections.unmodifiableMap(all);
    }

    /** No portfolio yet. */
    public static BookSummary empty() {
        return new BookSummary(Map.of());
    }

    /** The summary with one more portfolio of status {@code s}. */
    public BookSummary plus(Status s) {
        EnumMap<Status, Long> c = new EnumMap<>(counts);
        c.merge(s, 1L, Long::sum);
        return new BookSummary(c);
    }

    /** This summary and another one together (a run resumed after an earlier one's chunks). */
    public BookSummary plus(BookSummary other) {
        EnumMap<Status, Long> c = new EnumMap<>(counts);
        other.counts.forEach((k, v) -> c.merge(k, v, Long::sum));
        return new BookSummary(c);
    }

    /** The count of status {@code s}. */
    public long count(Status s) {
        return counts.get(s);
    }

    /** Every portfolio counted. */
    public long total() {
        return counts.values().stream().mapToLong(Long::longValue).sum();
    }

    /**
     * The status that decides a run's exit: invalid input before no solution before optimal (DESIGN.md: 2 wins
     * over 3); {@link Status#NOT_SOLVED} counts with the portfolios without a solution.
     */
    public Status worst() {
        if (count(Status.INVALID_INPUT) > 0) {
            return Status.INVALID_INPUT;
        }
        if (count(Status.INFEASIBLE) > 0) {
            return Status.INFEASIBLE;
        }
        if (count(Status.NOT_SOLVED) > 0) {
            return Status.NOT_SOLVED;
        }
        return Status.OPTIMAL;
    }

    /** The reduction that counts results by status, for {@link BatchRunner}. */
    static final BatchRunner.Reduction<PortfolioResult, long[]> COUNT = new BatchRunner.Reduction<>() {
        @Override
        public long[] identity() {
            return new long[Status.values().length];
        }

        @Override
        public long[] add(long[] total, PortfolioResult r) {
            total[r.status().ordinal()]++;
            return total;
        }
    };

    static BookSummary of(long[] counts) {
        EnumMap<Status, Long> c = new EnumMap<>(Status.class);
        for (Status s : Status.values()) {
            c.put(s, counts[s.ordinal()]);
        }
        return new BookSummary(c);
    }
}
