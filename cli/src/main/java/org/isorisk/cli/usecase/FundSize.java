package org.isorisk.cli.usecase;

import java.nio.file.Path;
import java.util.Locale;
import java.util.OptionalDouble;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.io.PortfolioFile;
import org.isorisk.engine.rebalance.Holdings;

/**
 * The fund size behind trade amounts, and the one rule for a size given beside holdings in market values: the two
 * must agree to {@link Holdings#SUM_TOLERANCE} of the given size, else the run is refused (bad input, exit 2)
 * naming the holdings file, both totals and what would fix it. {@code rebalance --fund-size} and the pack file's
 * {@code fund_size} go through here, so they are refused alike.
 */
public final class FundSize {
    private FundSize() {
    }

    /**
     * The fund size for amounts: the market values' total when the holdings give market values (after checking a
     * given size against it), else the given size, else none.
     *
     * @param held     the holdings as read
     * @param file     the holdings file, for the message
     * @param given    the fund size given besides the holdings, in the fund's currency
     * @param givenAs  how the message names where the size was given, e.g. {@code --fund-size}
     * @param dropIt   the second half of the fix, e.g. {@code drop --fund-size}
     * @return the fund size, or empty when neither the holdings nor {@code given} set one
     * @throws InputException when the market values and {@code given} disagree
     */
    public static OptionalDouble resolve(PortfolioFile held, Path file, OptionalDouble given, String givenAs,
                                         String dropIt) {
        if (held.marketValue().isEmpty()) {
            return given;
        }
        double mv = held.marketValue().getAsDouble();
        if (given.isPresent()) {
            double size = given.getAsDouble();
            if (Math.abs(mv - size) > Holdings.SUM_TOLERANCE * size) {
                throw InputException.of(String.format(Locale.ROOT, "the market values add up to %.2f but %s is %.2f",
                        mv, givenAs, size)).file(file.toString())
                        .fix("cash is an asset: add the cash balance as a row, or " + dropIt).build();
            }
        }
        return OptionalDouble.of(mv);
    }
}
