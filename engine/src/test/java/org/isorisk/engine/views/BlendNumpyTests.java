package org.isorisk.engine.views;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.isorisk.engine.ExternalTools;
import org.isorisk.engine.Tolerances;
import org.isorisk.engine.random.RandomStreams;
import org.isorisk.engine.random.Xoshiro256PlusPlus;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * The blend against the formulas written out in numpy ({@code src/test/scripts/black_litterman_numpy.py}, Debian
 * python3-numpy) at full precision: μ̄, M and w* = (δ(Σ + M))⁻¹μ̄ by numpy's LU solves, and the view weights by He
 * &amp; Litterman's (1999) own expression with Ω⁻¹ (so the general form derived in {@link Blend} is checked against
 * theirs), on their worked example and on generated problems.
 */
class BlendNumpyTests {

    @Test
    void posteriorOptimumAndViewWeightsMatchNumpy(@TempDir Path dir) throws IOException {
        List<Posterior> ours = new ArrayList<>();
        ours.add(Blend.posterior(HeLitterman.prior(),
                List.of(HeLitterman.germanyOverEurope(), HeLitterman.canadaOverUsa()), HeLitterman.TAU));
        Xoshiro256PlusPlus g = new RandomStreams(16).stream(0);
        for (int trial = 0; trial < 30; trial++) {
            BlendCase c = BlendCase.random(g, trial);
            ours.add(Blend.posterior(c.prior(), c.views(), c.tau()));
        }
        List<Map<String, Object>> cases = new ArrayList<>();
        for (Posterior post : ours) {
            Map<String, Object> m = new LinkedHashMap<>();
            Prior prior = post.prior();
            m.put("sigma", prior.covariance());
            m.put("pi", prior.excessReturns());
            double[][] p = new double[post.views().size()][];
            double[] q = new double[p.length];
            double[] omega = new double[p.length];
            for (int v = 0; v < p.length; v++) {
                BlendedView bv = post.views().get(v);
                p[v] = bv.portfolio();
                q[v] = Blend.excessViewReturn(bv.view(), prior.riskFree());
                omega[v] = bv.variance();
            }
            m.put("P", p);
            m.put("Q", q);
            m.put("omega", omega);
            m.put("delta", prior.riskAversion());
            m.put("tau", post.tau());
            cases.add(m);
        }
        ObjectMapper json = new ObjectMapper();
        Path file = dir.resolve("blend-cases.json");
        Files.writeString(file, json.writeValueAsString(cases));
        JsonNode ref = json.readTree(ExternalTools.python("python3-numpy",
                List.of(ExternalTools.scripts().resolve("black_litterman_numpy.py").toString(), file.toString()), 120));
        int lambdas = 0;
        for (int c = 0; c < ours.size(); c++) {
            Posterior post = ours.get(c);
            JsonNode r = ref.get(c);
            int n = post.assets().size();
            double[] mu = post.excessReturns();
            double[][] m = post.meanUncertainty();
            double[] w = post.optimalWeights();
            double wScale = 0;
            for (double x : w) {
                wScale = Math.max(wScale, Math.abs(x));
            }
            double sScale = post.prior().covariance()[0][0];
            for (int i = 0; i < n; i++) {
                assertEquals(r.get("posterior").get(i).asDouble(), mu[i], Tolerances.CLOSED_FORM, "case " + c + " μ̄");
                assertEquals(r.get("optimal").get(i).asDouble(), w[i], Tolerances.CLOSED_FORM * wScale,
                        "case " + c + " w*");
                for (int j = 0; j < n; j++) {
                    assertEquals(r.get("M").get(i).get(j).asDouble(), m[i][j], Tolerances.CLOSED_FORM * sScale,
                            "case " + c + " M");
                }
            }
            if (!r.get("lambda").isNull()) {
                lambdas++;
                double[] lambda = post.viewWeights().orElseThrow();
                for (int v = 0; v < lambda.length; v++) {
                    assertEquals(r.get("lambda").get(v).asDouble(), lambda[v], Tolerances.CLOSED_FORM
                            * Math.max(1, Math.abs(lambda[v])), "case " + c + " Λ");
                }
            }
        }
        assertTrue(lambdas >= 15, "He & Litterman's Λ needs Ω invertible; cases with it: " + lambdas);
    }
}
