package org.isorisk.engine.rebalance;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.File;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;
import java.util.Random;
import java.util.Set;
import java.util.concurrent.TimeUnit;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Mandate;
import org.junit.jupiter.api.Assumptions;
import org.junit.jupiter.api.Test;

/**
 * The turnover-limited rebalance against an independent solver: cvxopt's interior-point QP (Debian's
 * python3-cvxopt) on its own formulation with (w, b, s), through
 * {@code src/test/scripts/check_turnover_limited_rebalance_with_cvxopt.py}.
 */
class TurnoverCrossCheckTests {

    static final File SCRIPT = org.isorisk.engine.ExternalTools.scripts()
            .resolve("check_turnover_limited_rebalance_with_cvxopt.py").toFile();
    static final String PYTHON = "/usr/bin/python3";

    @Test
    void theTurnoverLimitedProposalMatchesCvxopt() throws Exception {
        Assumptions.assumeTrue(new File(PYTHON).canExecute(), "skipped: " + PYTHON + " is not installed");
        assertTrue(SCRIPT.isFile(), SCRIPT + " not found: it lives beside the other reference scripts");
        int binding = 0;
        for (long seed = 1; seed <= 4; seed++) {
            int n = 7;
            Random rnd = new Random(seed);
            AssetUniverse u = org.isorisk.engine.TestUniverses.random(n, seed);
            double[] lo = new double[n];
            double[] hi = new double[n];
            double[] w0 = new double[n];
            double[] bps = new double[n];
            double[] costs = new double[n];
            for (int i = 0; i < n; i++) {
                hi[i] = 0.35;
                w0[i] = 1.0 / n;
                bps[i] = 5 + 40 * rnd.nextDouble();
                costs[i] = bps[i] / 10_000;
            }
            double tau = 0.08 + 0.1 * rnd.nextDouble();
            double target = 0.0;
            for (int i = 0; i < n; i++) {
                target += u.expectedReturn(i) * w0[i];
            }
            target += 0.002; // a little above today's return: binding target and binding turnover
            Mandate m = Mandate.fullyInvested(n).withBounds(lo, hi);
            List<String> assets = u.assets();
            TradingLimits lim = TradingLimits.none(n).withMaxTurnover(tau).withCostBps(bps);
            RebalanceResult r = Rebalancer.rebalance(new RebalanceRequest(u, m, Holdings.ofWeights(assets, w0,
                    Double.NaN), lim, new RebalanceObjective.TargetReturn(target), null));

            JsonNode ref = cvxopt(u, w0, lo, hi, tau, costs, target);
            Assumptions.assumeTrue(ref != null, "skipped: python3-cvxopt is not installed for " + PYTHON
                    + " (Debian package python3-cvxopt)");
            assertTrue(ref.get("primal_infeasibility").asDouble() < 1e-9, ref.toString());
            assertTrue(ref.get("dual_infeasibility").asDouble() < 1e-9, ref.toString());
            for (int i = 0; i < n; i++) {
                assertEquals(ref.get("weights").get(i).asDouble(), r.proposal().weight(i), RebalancerTests.LIFTED,
                        "seed " + seed + ", asset " + i);
            }
            assertEquals(ref.get("variance").asDouble(), r.proposal().variance(), 1e-9);
            double price = r.turnoverPrice().orElseThrow().variancePerUnit();
            assertEquals(ref.get("turnover_price").asDouble(), price, 1e-6 * Math.max(1e-3, Math.abs(price)) + 1e-9,
                    "turnover shadow price, seed " + seed);
            assertEquals(ref.get("target_price").asDouble(),
                    r.proposal().multiplier("target_return").orElseThrow().variancePerUnit(), 1e-6,
                    "target shadow price, seed " + seed);
            assertTrue(r.proposal().certificate().passes(), r.proposal().certificate().toString());
            binding += price < -1e-6 ? 1 : 0;
        }
        assertTrue(binding >= 2, "the check must exercise a binding turnover limit; binding in " + binding + " of 4");
    }

    /** Runs the script; null when cvxopt is missing (exit code 3). */
    static JsonNode cvxopt(AssetUniverse u, double[] w0, double[] lo, double[] hi, double tau, double[] costs,
                           double target) throws IOException, InterruptedException {
        ObjectMapper om = new ObjectMapper();
        ObjectNode in = om.createObjectNode();
        ArrayNode s = in.putArray("sigma");
        for (double[] row : u.covariance()) {
            ArrayNode r = s.addArray();
            for (double v : row) {
                r.add(v);
            }
        }
        add(in.putArray("mu"), u.expectedReturns());
        add(in.putArray("w0"), w0);
        add(in.putArray("lower"), lo);
        add(in.putArray("upper"), hi);
        add(in.putArray("costs"), costs);
        in.put("turnover", tau);
        in.put("target", target);
        Process p = new ProcessBuilder(PYTHON, SCRIPT.getPath()).redirectError(ProcessBuilder.Redirect.DISCARD).start();
        p.getOutputStream().write(om.writeValueAsBytes(in));
        p.getOutputStream().close();
        String out = new String(p.getInputStream().readAllBytes(), StandardCharsets.UTF_8);
        assertTrue(p.waitFor(60, TimeUnit.SECONDS));
        if (p.exitValue() == 3) {
            return null;
        }
        assertEquals(0, p.exitValue(), out);
        return om.readTree(out);
    }

    private static void add(ArrayNode a, double[] v) {
        for (double x : v) {
            a.add(x);
        }
    }

}
