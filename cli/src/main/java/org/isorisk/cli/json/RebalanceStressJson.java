package org.isorisk.cli.json;

import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import org.isorisk.engine.explain.Explain;
import org.isorisk.engine.model.Multiplier;
import org.isorisk.engine.rebalance.Breach;
import org.isorisk.engine.rebalance.RebalanceResult;
import org.isorisk.engine.rebalance.Trade;
import org.isorisk.engine.stress.BindingChange;
import org.isorisk.engine.stress.ScenarioPoint;
import org.isorisk.engine.stress.ScenarioResult;
import org.isorisk.engine.stress.Shock;
import org.isorisk.engine.stress.StressResult;
import org.isorisk.engine.stress.Sweep;
import org.isorisk.engine.stress.TargetPoint;

/**
 * The JSON shapes of rebalancing proposals and stress runs, built from {@link ResultJson}'s pieces (snake_case,
 * decimals, non-finite numbers as null). {@link ResultJson#finish} adds {@code timing_ms.total} and the caution.
 */
public final class RebalanceStressJson {
    private RebalanceStressJson() {
    }

    /** A rebalancing proposal: breaches first, then trades, totals, risk and shadow prices. */
    public static ObjectNode rebalance(RebalanceResult r) {
        ObjectNode o = ResultJson.object();
        o.put("status", r.proposal().status().label());
        o.put("objective", r.objective());
        o.put("turnover_convention", RebalanceResult.TURNOVER_CONVENTION);
        o.put("cost_convention", RebalanceResult.COST_CONVENTION);
        ArrayNode br = o.putArray("breaches");
        for (Breach b : r.breaches()) {
            ObjectNode e = br.addObject();
            e.put("constraint", b.constraint());
            ResultJson.number(e, "current", b.current());
            ResultJson.number(e, "limit", b.limit());
            ResultJson.number(e, "excess", b.excess());
            ResultJson.number(e, "proposed", b.proposed());
            ArrayNode c = e.putArray("cured_by");
            b.cures().forEach(t -> c.add(t.asset()));
            e.put("description", b.description());
        }
        ArrayNode tr = o.putArray("trades");
        for (Trade t : r.trades()) {
            ObjectNode e = tr.addObject();
            e.put("asset", t.asset());
            ResultJson.number(e, "current_weight", t.current());
            ResultJson.number(e, "target_weight", t.target());
            ResultJson.number(e, "trade_weight", t.trade());
            ResultJson.number(e, "trade_amount", t.amount());
            ResultJson.number(e, "cost", t.cost());
            e.put("side", t.side().label());
            if (t.frozen() == null) {
                e.putNull("frozen");
            } else {
                e.put("frozen", t.frozen());
            }
        }
        ObjectNode to = o.putObject("turnover");
        ResultJson.number(to, "two_way", r.turnover());
        ResultJson.number(to, "buys", r.buys());
        ResultJson.number(to, "sells", r.sells());
        ObjectNode cost = o.putObject("cost");
        ResultJson.number(cost, "fraction_of_fund", r.cost());
        ResultJson.number(cost, "amount", r.costAmount());
        ObjectNode before = o.putObject("current");
        ResultJson.number(before, "expected_return", r.currentReturn());
        ResultJson.number(before, "volatility", r.currentVolatility());
        if (r.currentRisk() != null) {
            before.set("risk", ResultJson.decomposition(r.currentRisk(), true));
        }
        ObjectNode after = o.putObject("proposed");
        ResultJson.number(after, "expected_return", r.proposedReturn());
        ResultJson.number(after, "expected_return_after_costs", r.proposedNetReturn());
        ResultJson.number(after, "volatility", r.proposedVolatility());
        if (r.proposedRisk() != null) {
            after.set("risk", ResultJson.decomposition(r.proposedRisk(), true));
        }
        o.set("tracking_error", ResultJson.trackingError(r.activeRisk()));
        if (r.turnoverPrice().isPresent()) {
            o.set("turnover_shadow_price", multiplier(r.turnoverPrice().get(), null));
        } else {
            o.putNull("turnover_shadow_price");
        }
        ArrayNode b = o.putArray("binding");
        for (Multiplier m : r.binding()) {
            b.add(multiplier(m, null));
        }
        o.set("sentences", ResultJson.strings(r.sentences()));
        o.set("frozen_by_minimum_trade", ResultJson.strings(r.frozen()));
        o.put("minimum_trade_rounds", r.rounds());
        o.set("proposal", ResultJson.solution(r.proposal()));
        o.set("notes", ResultJson.strings(r.notes()));
        return o;
    }

    private static ObjectNode multiplier(Multiplier m, String sentence) {
        ObjectNode e = ResultJson.object();
        e.put("constraint", m.constraint());
        ResultJson.number(e, "variance_per_unit", m.variancePerUnit());
        ResultJson.number(e, "volatility_per_unit", m.volatilityPerUnit());
        e.put("binding", m.binding());
        e.put("sentence", sentence != null ? sentence : Explain.sentence(m));
        return e;
    }

    /** A stress run: the base sweep and every scenario over the same targets. */
    public static ObjectNode stress(StressResult s) {
        ObjectNode o = ResultJson.object();
        o.put("status", "ok");
        o.set("base", sweep(s.base()));
        ArrayNode sc = o.putArray("scenarios");
        for (ScenarioResult r : s.scenarios()) {
            ObjectNode e = sc.addObject();
            e.put("name", r.scenario().name());
            e.put("description", r.scenario().summary());
            ArrayNode sh = e.putArray("shocks");
            for (Shock k : r.scenario().shocks()) {
                sh.add(k.describe());
            }
            ObjectNode rep = e.putObject("repair");
            rep.put("repaired", r.shocked().repaired());
            ResultJson.number(rep, "smallest_eigenvalue_before", r.shocked().smallestEigenvalue());
            ResultJson.number(rep, "frobenius_distance", r.shocked().repairDistance());
            ResultJson.number(rep, "largest_change", r.shocked().largestChange());
            ResultJson.number(e, "max_target", r.maxTarget());
            ArrayNode pts = e.putArray("points");
            for (ScenarioPoint p : r.points()) {
                ObjectNode q = pts.addObject();
                ResultJson.number(q, "target", p.target());
                q.put("feasible", p.feasible());
                ResultJson.number(q, "volatility", p.volatility());
                ResultJson.number(q, "change_vs_base", p.change());
                ResultJson.number(q, "base_portfolio_volatility", p.baseRisk());
                ResultJson.number(q, "base_portfolio_return", p.baseReturn());
                ResultJson.number(q, "turnover_to_reoptimise", p.turnover());
                ResultJson.number(q, "marginal_risk", p.marginalRisk());
                q.set("binding", ResultJson.strings(p.binding()));
                if (!p.reason().isEmpty()) {
                    q.put("reason", p.reason());
                }
            }
        }
        o.put("threads", s.threads());
        o.set("notes", ResultJson.strings(s.notes()));
        return o;
    }

    /** A target sweep. */
    public static ObjectNode sweep(Sweep w) {
        ObjectNode o = ResultJson.object();
        ResultJson.number(o, "min_target", w.minTarget());
        ResultJson.number(o, "max_target", w.maxTarget());
        ArrayNode pts = o.putArray("points");
        for (TargetPoint p : w.points()) {
            ObjectNode q = pts.addObject();
            ResultJson.number(q, "target", p.target());
            q.put("feasible", p.feasible());
            ResultJson.number(q, "volatility", p.volatility());
            ResultJson.number(q, "marginal_risk", p.marginalRisk());
            q.set("binding", ResultJson.strings(p.binding()));
            if (p.feasible()) {
                ObjectNode wt = q.putObject("weights");
                for (int i = 0; i < p.solution().assets().size(); i++) {
                    ResultJson.number(wt, p.solution().assets().get(i), p.solution().weight(i));
                }
            } else {
                q.put("reason", p.reason());
            }
        }
        ArrayNode ch = o.putArray("binding_changes");
        for (BindingChange c : w.changes()) {
            ObjectNode q = ch.addObject();
            ResultJson.number(q, "at", c.at());
            ResultJson.number(q, "between", c.from());
            ResultJson.number(q, "and", c.to());
            q.put("exact", c.exact());
            q.set("entered", ResultJson.strings(c.entered()));
            q.set("left", ResultJson.strings(c.left()));
        }
        return o;
    }

}
