package org.isorisk.engine.book;

import java.io.Serializable;
import org.isorisk.engine.io.Units;

/**
 * What a book run does, as plain paths and names, so that every engine (in process, or each Spark executor) can
 * open the same files through its own file system and build the same {@link BookJob}.
 *
 * @param job             solve, rebalance or stress
 * @param book            the book file
 * @param expectedReturns the run's own assumptions (for rows that name no set): expected returns; null when none
 * @param covariance      its covariance; null when volatilities and a correlation matrix are given instead
 * @param volatilities    volatilities, with {@code correlation}; null when not used
 * @param correlation     correlation matrix, with {@code volatilities}; null when not used
 * @param assumptionSets  the file of named assumption sets (see {@link AssumptionSets}); null when none
 * @param policy          the shared policy for rows whose {@code policy} cell is blank; null when none
 * @param scenarios       the stress scenarios (the stress job); null when none
 * @param units           units of the numbers in the files and in the book
 * @param json            true to keep what the engine returned with each result, for the caller to render the
 *                        single command's JSON of each portfolio
 */
public record BookSpec(Job job, String book, String expectedReturns, String covariance, String volatilities,
                       String correlation, String assumptionSets, String policy, String scenarios, Units units,
                       boolean json) implements Serializable {
    private static final long serialVersionUID = 1L;

    public BookSpec {
        if (job == null || book == null) {
            throw new IllegalArgumentException("a book run needs its job and its book");
        }
        units = units == null ? Units.DECIMAL : units;
    }

    /** True when the run has assumptions of its own (not only named sets). */
    public boolean hasOwnAssumptions() {
        return expectedReturns != null || covariance != null || volatilities != null || correlation != null;
    }
}
