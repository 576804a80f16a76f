package org.isorisk.engine.rebalance;

import java.util.Arrays;
import java.util.List;
import java.util.Set;
import java.util.TreeSet;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.model.Policy;

/**
 * The limits a rebalance must respect on top of the mandate.
 *
 * <p>Turnover is <b>two-way</b>: {@code Σ|w_i − w0_i|}, buys plus sells, as a fraction of the fund (the
 * policy's {@code turnover.max}). When the budget does not change, buys equal sells, and one-way turnover
 * (buys alone) is half of it; both are reported.
 *
 * <p>Costs are proportional, {@code c_i} basis points of the amount traded in asset i, and are <b>deducted
 * from the return the target must reach</b>: the target constraint is {@code μ'w − Σ c_i|w_i − w0_i| ≥ m}
 * (cost as a one-off drag over the horizon of the expected returns, i.e. one year). They are not penalised in
 * the objective, so the objective stays pure variance and every multiplier keeps the meaning ∂V*∂limit.
 *
 * @param maxTurnover  τ, the largest two-way turnover, decimal; {@code +Infinity} for none
 * @param maxTrade     per-asset largest |trade|, decimal, one entry per asset; {@code +Infinity} for none (copied)
 * @param costBps      per-asset proportional cost in basis points (10 bps = 0.10 % of the amount traded) (copied)
 * @param minTrade     smallest trade kept, decimal weight; smaller trades are dropped and the asset frozen at
 *                     its current weight; 0 keeps every trade
 * @param noTrade      indices of assets that must not be traded (copied)
 */
public record TradingLimits(double maxTurnover, double[] maxTrade, double[] costBps, double minTrade,
                            Set<Integer> noTrade) {

    public TradingLimits {
        if (Double.isNaN(maxTurnover) || maxTurnover < 0) {
            throw InputException.of("the turnover limit must be zero or positive").value(maxTurnover)
                    .fix("give turnover.max (or --max-turnover) as a decimal, e.g. 0.20 for 20 %").build();
        }
        if (maxTrade == null || costBps == null || maxTrade.length != costBps.length) {
            throw new IllegalArgumentException("one trade limit and one cost per asset");
        }
        maxTrade = maxTrade.clone();
        costBps = costBps.clone();
        for (int i = 0; i < maxTrade.length; i++) {
            if (Double.isNaN(maxTrade[i]) || maxTrade[i] < 0) {
                throw InputException.of("a per-asset trade limit must be zero or positive").value(maxTrade[i])
                        .fix("give the largest trade as a decimal weight, e.g. 0.05").build();
            }
            if (!Double.isFinite(costBps[i]) || costBps[i] < 0) {
                throw InputException.of("a trading cost must be a non-negative number of basis points")
                        .value(costBps[i]).fix("give costs_bps as e.g. 10 for 0.10 %").build();
            }
        }
        if (!Double.isFinite(minTrade) || minTrade < 0) {
            throw InputException.of("the minimum trade size must be zero or positive").value(minTrade)
                    .fix("give the minimum trade as a decimal weight, e.g. 0.0025 for 0.25 %").build();
        }
        noTrade = java.util.Collections.unmodifiableSortedSet(new TreeSet<>(noTrade == null ? Set.of() : noTrade));
        for (int i : noTrade) {
            if (i < 0 || i >= maxTrade.length) {
                throw new IllegalArgumentException("no-trade index outside the universe: " + i);
            }
        }
    }

    /** No limit at all on n assets: any turnover, no costs, every trade kept. */
    public static TradingLimits none(int n) {
        double[] inf = new double[n];
        Arrays.fill(inf, Double.POSITIVE_INFINITY);
        return new TradingLimits(Double.POSITIVE_INFINITY, inf, new double[n], 0, Set.of());
    }

    /**
     * The trading limits a policy file sets: {@code turnover.max}, {@code costs_bps} and the {@code trading}
     * section (per-asset trade limits, minimum trade size, no-trade list); no limit where the policy sets none.
     * The {@code rebalance} command starts from these and applies its options; the committee pack uses them as
     * they are.
     *
     * @param p the policy, as read by the policy reader
     */
    public static TradingLimits of(Policy p) {
        int n = p.mandate().size();
        double[] trade = p.maxTrade();
        if (trade == null) {
            trade = new double[n];
            Arrays.fill(trade, Double.POSITIVE_INFINITY);
        }
        double[] costs = p.costsBps() == null ? new double[n] : p.costsBps();
        return new TradingLimits(p.turnoverMax().orElse(Double.POSITIVE_INFINITY), trade, costs, p.minTrade(),
                p.noTrade());
    }

    /**
     * True when some limit restricts which trades may be made: a finite turnover limit, a finite per-asset trade
     * limit, a positive minimum trade size or a non-empty no-trade list. Costs alone restrict nothing (they only
     * price the trades).
     */
    public boolean restrictsTrading() {
        if (Double.isFinite(maxTurnover) || minTrade > 0 || !noTrade.isEmpty()) {
            return true;
        }
        for (double t : maxTrade) {
            if (Double.isFinite(t)) {
                return true;
            }
        }
        return false;
    }

    /**
     * Two-way turnover {@code Σ|to_i − from_i|} of a move between two portfolios (the convention of
     * {@link RebalanceResult#TURNOVER_CONVENTION}), decimal.
     */
    public static double turnover(double[] from, double[] to) {
        if (from.length != to.length) {
            throw new IllegalArgumentException("two portfolios of the same assets");
        }
        double t = 0;
        for (int i = 0; i < from.length; i++) {
            t += Math.abs(to[i] - from[i]);
        }
        return t;
    }

    /**
     * Estimated cost {@code Σ c_i |to_i − from_i|} of a move at these limits' proportional costs, decimal fraction
     * of the fund (the cost a rebalance reports, {@link RebalanceResult#cost()}).
     */
    public double cost(double[] from, double[] to) {
        if (from.length != size() || to.length != size()) {
            throw new IllegalArgumentException("one weight per asset of the limits");
        }
        double c = 0;
        for (int i = 0; i < from.length; i++) {
            c += cost(i) * Math.abs(to[i] - from[i]);
        }
        return c;
    }

    /**
     * The limits a move between two portfolios breaks, by their names in the contract, in this order: {@code turnover}
     * (two-way turnover above the limit), {@code trade_limit:<asset>} (a trade larger than the asset's limit),
     * {@code no_trade:<asset>} (a trade in an asset of the no-trade list). A move is beyond a limit when it exceeds
     * it by more than {@link Rebalancer#ZERO_TRADE} (round-off). The minimum trade size is not a limit a move can
     * break: a smaller trade is dropped, not refused.
     *
     * @param assets the names of the assets, in the order of the weights
     */
    public List<String> brokenBy(double[] from, double[] to, List<String> assets) {
        if (from.length != size() || to.length != size() || assets.size() != size()) {
            throw new IllegalArgumentException("one weight and one name per asset of the limits");
        }
        List<String> out = new java.util.ArrayList<>();
        if (turnover(from, to) > maxTurnover + Rebalancer.ZERO_TRADE) {
            out.add("turnover");
        }
        for (int i = 0; i < size(); i++) {
            if (Math.abs(to[i] - from[i]) > maxTrade(i) + Rebalancer.ZERO_TRADE) {
                out.add("trade_limit:" + assets.get(i));
            }
        }
        for (int i : noTrade) {
            if (Math.abs(to[i] - from[i]) > Rebalancer.ZERO_TRADE) {
                out.add("no_trade:" + assets.get(i));
            }
        }
        return out;
    }

    /** Number of assets covered. */
    public int size() {
        return maxTrade.length;
    }

    @Override
    public double[] maxTrade() {
        return maxTrade.clone();
    }

    @Override
    public double[] costBps() {
        return costBps.clone();
    }

    /** Cost of asset i as a decimal fraction of the amount traded (bps / 10 000). */
    public double cost(int i) {
        return costBps[i] / 10_000.0;
    }

    /** Largest |trade| of asset i. */
    public double maxTrade(int i) {
        return maxTrade[i];
    }

    /** True when some asset has a positive cost. */
    public boolean hasCosts() {
        for (double c : costBps) {
            if (c > 0) {
                return true;
            }
        }
        return false;
    }

    public TradingLimits withMaxTurnover(double t) {
        return new TradingLimits(t, maxTrade, costBps, minTrade, noTrade);
    }

    public TradingLimits withCostBps(double[] c) {
        return new TradingLimits(maxTurnover, maxTrade, c, minTrade, noTrade);
    }

    public TradingLimits withMinTrade(double m) {
        return new TradingLimits(maxTurnover, maxTrade, costBps, m, noTrade);
    }

    public TradingLimits withNoTrade(Set<Integer> nt) {
        return new TradingLimits(maxTurnover, maxTrade, costBps, minTrade, nt);
    }

    public TradingLimits withMaxTrade(double[] t) {
        return new TradingLimits(maxTurnover, t, costBps, minTrade, noTrade);
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof TradingLimits t && Double.compare(t.maxTurnover, maxTurnover) == 0
                && Arrays.equals(t.maxTrade, maxTrade) && Arrays.equals(t.costBps, costBps)
                && Double.compare(t.minTrade, minTrade) == 0 && t.noTrade.equals(noTrade);
    }

    @Override
    public int hashCode() {
        return Double.hashCode(maxTurnover) * 31 + Arrays.hashCode(costBps);
    }
}
