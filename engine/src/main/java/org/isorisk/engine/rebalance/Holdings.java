package org.isorisk.engine.rebalance;

import java.util.HashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Checks;

/**
 * Today's portfolio: one weight per asset (cash is an asset like any other) and, when known, the fund size in
 * the fund's currency, used to turn trade weights into trade amounts.
 *
 * @param assets   asset names as held (copied)
 * @param weights  current weights, decimal (copied)
 * @param fundSize fund size in the fund's currency; {@code NaN} when unknown (amounts are then not shown)
 */
public record Holdings(List<String> assets, double[] weights, double fundSize) {

    /**
     * How far the weights may sum away from the budget and still be accepted (rescaled, with a note):
     * 5e-4, enough for weights typed with four decimals into a spreadsheet; common practice, no source.
     */
    public static final double SUM_TOLERANCE = 5e-4;

    public Holdings {
        if (assets == null || assets.isEmpty()) {
            throw InputException.of("the holdings name no asset").fix("give one row per asset held").build();
        }
        assets = List.copyOf(assets);
        weights = Checks.finiteCopy(weights, assets.size(), "holding weights");
        if (!Double.isNaN(fundSize) && !(fundSize > 0 && Double.isFinite(fundSize))) {
            throw InputException.of("the fund size must be a positive number").value(fundSize)
                    .fix("give --fund-size as a positive amount in the fund's currency").build();
        }
    }

    /** Holdings given as weights; amounts need {@code fundSize} (NaN when unknown). */
    public static Holdings ofWeights(List<String> assets, double[] weights, double fundSize) {
        return new Holdings(assets, weights, fundSize);
    }

    /**
     * Holdings given as market values in the fund's currency: weights are value / fund size. Without a fund size
     * ({@code NaN}) the fund size is the total market value; with one, the values must add up to it (cash is an
     * asset, so the cash balance belongs in the list).
     */
    public static Holdings ofMarketValues(List<String> assets, double[] values, double fundSize) {
        double[] v = Checks.finiteCopy(values, assets.size(), "market values");
        double total = 0;
        for (int i = 0; i < v.length; i++) {
            if (v[i] < 0) {
                throw InputException.of("a market value is negative").asset(assets.get(i)).value(v[i])
                        .fix("give short positions as negative weights in a weight column instead").build();
            }
            total += v[i];
        }
        if (!(total > 0)) {
            throw InputException.of("the market values add up to zero").fix("give the value held in each asset").build();
        }
        double size = Double.isNaN(fundSize) ? total : fundSize;
        if (Math.abs(total - size) > SUM_TOLERANCE * size) {
            throw InputException.of(String.format(Locale.ROOT,
                    "the market values add up to %.2f but the fund size is %.2f", total, size))
                    .fix("cash is an asset: add the cash balance as a row, or give the fund size the values add up to")
                    .build();
        }
        double[] w = new double[v.length];
        for (int i = 0; i < v.length; i++) {
            w[i] = v[i] / size;
        }
        return new Holdings(assets, w, size);
    }

    @Override
    public double[] weights() {
        return weights.clone();
    }

    /** True when a fund size is known, so that trade amounts can be given in currency. */
    public boolean hasFundSize() {
        return !Double.isNaN(fundSize);
    }

    /**
     * The current weights in the universe's asset order: assets of the universe not held get weight 0; a held
     * asset the universe does not know is an error naming it. Weights that miss the budget by at most
     * {@link #SUM_TOLERANCE} are rescaled to it (the caller says so); beyond that it is an error.
     *
     * @param universe the assets the proposal is made for
     * @param budget   the mandate's sum of weights
     * @return weights aligned with {@code universe.assets()}
     */
    public double[] alignedTo(AssetUniverse universe, double budget) {
        Map<String, Integer> at = new HashMap<>();
        for (int i = 0; i < universe.size(); i++) {
            at.put(universe.assets().get(i), i);
        }
        double[] w0 = new double[universe.size()];
        for (int k = 0; k < assets.size(); k++) {
            Integer i = at.get(assets.get(k));
            if (i == null) {
                throw InputException.of("the holdings name an asset that has no expected return and covariance")
                        .asset(assets.get(k))
                        .fix("add the asset to the expected-return and covariance files, or correct its name").build();
            }
            w0[i] += weights[k];
        }
        double sum = 0;
        for (double v : w0) {
            sum += v;
        }
        if (Math.abs(sum - budget) > SUM_TOLERANCE * Math.max(1, Math.abs(budget))) {
            throw InputException.of(String.format(Locale.ROOT, "the holding weights add up to %.6f, not to the budget %.6f",
                            sum, budget))
                    .fix("cash is an asset: add or correct the cash row so that the weights add up to the budget")
                    .build();
        }
        if (sum != budget && sum != 0) { // within SUM_TOLERANCE: rounding in a spreadsheet
            double f = budget / sum;
            for (int i = 0; i < w0.length; i++) {
                w0[i] *= f;
            }
        }
        return w0;
    }
}
