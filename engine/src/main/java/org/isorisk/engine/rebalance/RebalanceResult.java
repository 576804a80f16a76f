package org.isorisk.engine.rebalance;

import java.util.List;
import java.util.Optional;
import org.isorisk.engine.model.Multiplier;
import org.isorisk.engine.model.Solution;
import org.isorisk.engine.risk.RiskDecomposition;
import org.isorisk.engine.risk.TrackingError;

/**
 * A rebalancing proposal with everything needed to explain and trust it.
 *
 * @param objective          {@code target}, {@code same-risk} or {@code nearest}
 * @param proposal           the proposed portfolio; its multipliers are those of the mandate and of the trading
 *                           limits in the convention ∂V*∂limit, its certificate that of the lifted problem
 * @param current            today's weights in the universe's asset order
 * @param trades             one line per asset, in the universe's asset order
 * @param breaches           limits today's holdings break, with the trades that cure them (reported first)
 * @param turnover           two-way turnover {@code Σ|w − w0|} (buys plus sells), decimal
 * @param buys               one-way turnover, the buys alone, decimal
 * @param sells              the sells alone, decimal
 * @param cost               estimated cost {@code Σ c_i|w_i − w0_i|}, decimal fraction of the fund
 * @param costAmount         cost in the fund's currency; NaN without a fund size
 * @param currentReturn      {@code μ'w0}
 * @param currentVolatility  {@code sqrt(w0'Σw0)}
 * @param proposedReturn     {@code μ'w} before costs
 * @param proposedNetReturn  {@code μ'w − cost}
 * @param proposedVolatility {@code sqrt(w'Σw)}
 * @param trackingError      {@code sqrt((w − w0)'Σ(w − w0))}, the proposal's tracking error against today
 * @param currentRisk        risk decomposition of today's portfolio (null when it has no risk at all)
 * @param proposedRisk       risk decomposition of the proposal (null when it has no risk at all)
 * @param activeRisk         tracking error against today with the contributions of the trades to it
 * @param turnoverPrice      shadow price of the turnover limit ({@code turnover}); empty without a limit
 * @param binding            every binding limit (mandate and trading) with its shadow price
 * @param sentences          plain readings of the turnover shadow price and of the other binding limits
 * @param frozen             assets frozen at today's weight because their trade was below the minimum size
 * @param rounds             solves of the minimum-trade rule (1 when no trade was dropped)
 * @param notes              remarks for the reader (conventions, rescaled holdings, how the objective was met)
 */
public record RebalanceResult(String objective, Solution proposal, double[] current, List<Trade> trades,
                              List<Breach> breaches, double turnover, double buys, double sells, double cost,
                              double costAmount, double currentReturn, double currentVolatility,
                              double proposedReturn, double proposedNetReturn, double proposedVolatility,
                              double trackingError, RiskDecomposition currentRisk, RiskDecomposition proposedRisk,
                              TrackingError activeRisk, Optional<Multiplier> turnoverPrice, List<Multiplier> binding,
                              List<String> sentences, List<String> frozen, int rounds, List<String> notes) {

    /** How turnover is counted, in words; printed with every result. */
    public static final String TURNOVER_CONVENTION = "Turnover is two-way: the sum of |target − current| over all "
            + "assets (buys plus sells), as a fraction of the fund; one-way turnover (buys alone) is half of it when "
            + "the budget is unchanged.";

    /** How costs enter, in words; printed with every result. */
    public static final String COST_CONVENTION = "Trading costs (basis points of the amount traded) are deducted from "
            + "the return the target must reach: expected return minus costs must be at least the target; they are "
            + "not part of the risk objective.";

    public RebalanceResult {
        current = current.clone();
        trades = List.copyOf(trades);
        breaches = List.copyOf(breaches);
        binding = List.copyOf(binding);
        sentences = List.copyOf(sentences);
        frozen = List.copyOf(frozen);
        notes = List.copyOf(notes);
    }

    @Override
    public double[] current() {
        return current.clone();
    }
}
