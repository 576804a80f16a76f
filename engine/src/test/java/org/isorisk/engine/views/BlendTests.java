package org.isorisk.engine.views;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.isorisk.engine.Tolerances;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.error.NoSolutionException;
import org.isorisk.engine.random.RandomStreams;
import org.isorisk.engine.random.Xoshiro256PlusPlus;
import org.junit.jupiter.api.Test;

/** The views blend: the published worked example, the limits of confidence, τ, dependent views, the view weights. */
class BlendTests {

    /** Half a printed unit of the paper's 0.1 % figures, plus a tenth of it as margin for rounding in copies. */
    private static final double HALF_PRINTED_PERCENT = 0.0005 * 1.1;
    /** The same for the view weights, printed to three decimals. */
    private static final double HALF_PRINTED_THOUSANDTH = 0.0005 * 1.1;

    @Test
    void heAndLittermansWorkedExampleIsReproducedToThePrintedRounding() {
        // He & Litterman (1999), two relative views, Ω = diag(p'τΣp), δ = 2.5, τ = 0.05: the printed equilibrium
        // returns, posterior returns μ̄, optimal weights w* = (δ(Σ + M))⁻¹μ̄ and view weights Λ (in %).
        double[] printedPi = {3.9, 6.9, 8.4, 9.0, 4.3, 6.8, 7.6};
        double[] printedMu = {4.4, 8.7, 9.5, 11.2, 4.6, 7.0, 7.5};
        double[] printedW = {1.5, 41.9, -3.4, 33.6, 11.0, -8.2, 18.8};
        double[] printedLambda = {0.298, 0.418};
        Posterior post = Blend.posterior(HeLitterman.prior(),
                List.of(HeLitterman.germanyOverEurope(), HeLitterman.canadaOverUsa()), HeLitterman.TAU);
        double[] pi = HeLitterman.prior().expectedReturns();
        double[] mu = post.expectedReturns();
        double[] w = post.optimalWeights();
        for (int i = 0; i < 7; i++) {
            String a = HeLitterman.ASSETS.get(i);
            assertEquals(printedPi[i] / 100, pi[i], HALF_PRINTED_PERCENT, "He & Litterman (1999): Π of " + a);
            assertEquals(printedMu[i] / 100, mu[i], HALF_PRINTED_PERCENT, "He & Litterman (1999): μ̄ of " + a);
            assertEquals(printedW[i] / 100, w[i], HALF_PRINTED_PERCENT, "He & Litterman (1999): w* of " + a);
        }
        double[] lambda = post.viewWeights().orElseThrow();
        for (int v = 0; v < 2; v++) {
            assertEquals(printedLambda[v], lambda[v], HALF_PRINTED_THOUSANDTH, "He & Litterman (1999): Λ" + (v + 1));
        }
        assertEquals(Posterior.Method.CHOLESKY, post.method());
        assertEquals(0.5, post.views().get(0).impliedConfidence(), Tolerances.TIGHT, "ω = p'τΣp is c = ½");
    }

    @Test
    void thePublishedWeightsNeedTheUncertaintyOfTheMean() {
        // He & Litterman (1999) optimise with Σ + M: their printed weights are reproduced with it, not with Σ alone.
        // With Σ alone at least one weight misses the printed figure by more than half a printed unit.
        Posterior post = Blend.posterior(HeLitterman.prior(),
                List.of(HeLitterman.germanyOverEurope(), HeLitterman.canadaOverUsa()), HeLitterman.TAU);
        double[][] sigma = HeLitterman.covariance();
        double[] withSigmaOnly = new org.apache.commons.math3.linear.LUDecomposition(
                new org.apache.commons.math3.linear.Array2DRowRealMatrix(sigma)).getSolver()
                .solve(new org.apache.commons.math3.linear.ArrayRealVector(post.excessReturns())).mapDivide(2.5)
                .toArray();
        double[] printedW = {1.5, 41.9, -3.4, 33.6, 11.0, -8.2, 18.8};
        double worst = 0;
        for (int i = 0; i < 7; i++) {
            worst = Math.max(worst, Math.abs(withSigmaOnly[i] - printedW[i] / 100));
        }
        assertTrue(worst > HALF_PRINTED_PERCENT, "Σ alone would also match: " + worst);
    }

    @Test
    void theGroupHelperWeightsTheRestOfEuropeByMarketCapitalisation() {
        Map<String, Double> caps = new LinkedHashMap<>();
        for (int i = 0; i < 7; i++) {
            caps.put(HeLitterman.ASSETS.get(i), HeLitterman.WEIGHTS[i]);
        }
        Map<String, Double> europe = ViewPortfolios.weightedGroup("v", List.of("France", "UK"), caps);
        // Hand-computed: 5.2/17.6 and 12.4/17.6; He & Litterman print −0.295 and −0.705.
        assertEquals(5.2 / 17.6, europe.get("France"), Tolerances.TIGHT);
        assertEquals(12.4 / 17.6, europe.get("UK"), Tolerances.TIGHT);
        assertEquals(0.295, europe.get("France"), 0.0005, "He & Litterman (1999)");
        Map<String, Double> p = ViewPortfolios.difference("v", Map.of("Germany", 1.0), europe);
        assertEquals(1.0, p.get("Germany"), 0.0);
        assertEquals(-12.4 / 17.6, p.get("UK"), Tolerances.TIGHT);
        InputException same = assertThrows(InputException.class,
                () -> ViewPortfolios.difference("Europe over Europe", europe, europe));
        assertEquals("key 'portfolio': view 'Europe over Europe' compares a portfolio with itself: its two sides are "
                + "the same; fix: give two different assets or groups", same.getMessage());
        assertThrows(InputException.class,
                () -> ViewPortfolios.weightedGroup("v", List.of("France", "Spain"), caps));
    }

    @Test
    void zeroConfidenceGivesThePriorAndConfidenceNearZeroApproachesIt() {
        Prior prior = HeLitterman.prior();
        View v1 = HeLitterman.germanyOverEurope();
        View v2 = HeLitterman.canadaOverUsa();
        Posterior none = Blend.posterior(prior, List.of(v1.withConfidence(0), v2.withConfidence(0)), 0.05);
        assertArrayEquals(prior.expectedReturns(), none.expectedReturns(), 0.0, "c = 0 drops the views exactly");
        double[][] sigma = prior.covariance();
        for (int i = 0; i < 7; i++) {
            for (int j = 0; j < 7; j++) {
                assertEquals(0.05 * sigma[i][j], none.meanUncertainty()[i][j], 0.0, "no view: M = τΣ");
            }
            // He & Litterman (1999): without views the optimum is the equilibrium portfolio scaled by 1/(1 + τ).
            assertEquals(HeLitterman.WEIGHTS[i] / 1.05, none.optimalWeights()[i], Tolerances.CLOSED_FORM);
        }
        assertTrue(none.views().get(0).dropped());
        assertEquals(0.0, none.views().get(0).viewWeight(), 0.0);
        double previous = Double.POSITIVE_INFINITY;
        for (double c : new double[] {1e-3, 1e-6, 1e-9, 1e-12}) {
            Posterior post = Blend.posterior(prior, List.of(v1.withConfidence(c), v2.withConfidence(c)), 0.05);
            double gap = maxAbsDiff(prior.expectedReturns(), post.expectedReturns());
            // The tilt is O(c): ω = ((1 − c)/c)p'τΣp grows like 1/c.
            assertTrue(gap <= 0.1 * c, "c = " + c + ": " + gap);
            assertTrue(gap < previous);
            previous = gap;
        }
    }

    @Test
    void fullConfidenceMakesEveryViewHoldExactly() {
        Prior prior = HeLitterman.prior();
        List<View> views = List.of(HeLitterman.germanyOverEurope().withConfidence(1),
                HeLitterman.canadaOverUsa().withConfidence(1),
                View.absolute("Japan returns 6 %", "Japan", 0.06).withVariance(0));
        Posterior post = Blend.posterior(prior, views, 0.05);
        for (BlendedView v : post.views()) {
            assertEquals(v.viewReturn(), v.after(), Tolerances.TIGHT, v.name());
            assertEquals(1.0, v.impliedConfidence(), 0.0);
        }
        reconstructsTheOptimum(post);
    }

    @Test
    void dependentButConsistentFullConfidenceViewsAreSolvedAndNamed() {
        Prior prior = HeLitterman.prior();
        View a = View.relative("Canada over USA", "Canada", "USA", 0.03).withConfidence(1);
        View b = View.relative("USA over Japan", "USA", "Japan", 0.01).withConfidence(1);
        View c = View.relative("Canada over Japan", "Canada", "Japan", 0.04).withConfidence(1);
        View d = HeLitterman.germanyOverEurope(); // an uncertain view alongside
        Posterior three = Blend.posterior(prior, List.of(a, b, c, d), 0.05);
        Posterior two = Blend.posterior(prior, List.of(a, b, d), 0.05);
        assertEquals(Posterior.Method.EIGEN_PSEUDO_INVERSE, three.method());
        assertEquals(List.of("Canada over USA", "USA over Japan", "Canada over Japan"), three.dependentViews());
        assertFalse(three.viewWeightsUnique());
        for (BlendedView v : three.views().subList(0, 3)) {
            assertEquals(v.viewReturn(), v.after(), Tolerances.TIGHT, v.name());
        }
        // The redundant view changes nothing: the same posterior as without it.
        assertArrayEquals(two.expectedReturns(), three.expectedReturns(), Tolerances.TIGHT);
        for (int i = 0; i < 7; i++) {
            assertArrayEquals(two.meanUncertainty()[i], three.meanUncertainty()[i], Tolerances.TIGHT);
        }
        assertArrayEquals(two.optimalWeights(), three.optimalWeights(), Tolerances.CLOSED_FORM);
        reconstructsTheOptimum(three);
        // A repeated view with the same return is dependent and consistent too.
        Posterior twice = Blend.posterior(prior, List.of(a, View.relative("again", "Canada", "USA", 0.03)
                .withConfidence(1)), 0.05);
        assertEquals(List.of("Canada over USA", "again"), twice.dependentViews());
    }

    @Test
    void contradictingFullConfidenceViewsAreRefusedByName() {
        Prior prior = HeLitterman.prior();
        View a = View.relative("Canada over USA", "Canada", "USA", 0.03).withConfidence(1);
        View b = View.relative("USA over Japan", "USA", "Japan", 0.01).withConfidence(1);
        View c = View.relative("Canada over Japan", "Canada", "Japan", 0.05).withConfidence(1);
        NoSolutionException e = assertThrows(NoSolutionException.class,
                () -> Blend.posterior(prior, List.of(HeLitterman.germanyOverEurope(), a, b, c), 0.05));
        assertEquals(List.of("view:Canada over USA", "view:USA over Japan", "view:Canada over Japan"),
                e.constraints());
        assertEquals(NoSolutionException.Reason.INFEASIBLE, e.reason());
        // 0.03 + 0.01 − 0.05 = −0.01 (hand-computed).
        assertEquals("views 'Canada over USA', 'USA over Japan' and 'Canada over Japan' are held with full "
                + "confidence but contradict each other: the combination 'Canada over USA' + 'USA over Japan' - "
                + "'Canada over Japan' has a zero portfolio, yet a view return of -0.01 instead of 0; fix: lower the "
                + "confidence of one of them below 1 (or give it a variance above 0), or correct their returns",
                e.getMessage());
        // Two views on the same portfolio with different returns.
        NoSolutionException twice = assertThrows(NoSolutionException.class, () -> Blend.posterior(prior,
                List.of(a, View.relative("Canada over USA again", "Canada", "USA", 0.02).withConfidence(1)), 0.05));
        assertEquals(List.of("view:Canada over USA", "view:Canada over USA again"), twice.constraints());
        // Below full confidence the same views are a compromise, not a contradiction.
        Posterior soft = Blend.posterior(prior, List.of(a, b, c.withConfidence(0.9)), 0.05);
        assertEquals(Posterior.Method.CHOLESKY, soft.method());
    }

    @Test
    void tauCancelsFromThePosteriorReturnsWhenOmegaIsProportionalToTau() {
        Prior prior = HeLitterman.prior();
        double[] reference = null;
        double[][] firstM = null;
        for (double tau : new double[] {0.001, 0.05, 0.5, 2}) {
            // Ω = k·diag(p'τΣp) given as variances (k = 3 and 0.25), and the same through confidences.
            List<View> views = new ArrayList<>();
            View v1 = HeLitterman.germanyOverEurope();
            View v2 = HeLitterman.canadaOverUsa();
            views.add(v1.withVariance(3 * tau * quad(prior, v1)));
            views.add(v2.withVariance(0.25 * tau * quad(prior, v2)));
            Posterior byVariance = Blend.posterior(prior, views, tau);
            Posterior byConfidence = Blend.posterior(prior, List.of(v1.withConfidence(0.25), v2.withConfidence(0.8)),
                    tau);
            assertArrayEquals(byVariance.expectedReturns(), byConfidence.expectedReturns(), Tolerances.TIGHT);
            if (reference == null) {
                reference = byVariance.expectedReturns();
                firstM = byVariance.meanUncertainty();
            } else {
                assertArrayEquals(reference, byVariance.expectedReturns(), Tolerances.TIGHT, "τ = " + tau);
                assertTrue(Math.abs(firstM[0][0] - byVariance.meanUncertainty()[0][0]) > 1e-6, "M scales with τ");
            }
        }
    }

    @Test
    void oneViewsConfidenceIsTheShareOfTheFullConfidenceTiltInTheWeights() {
        // Idzorek (2005): with weights (δΣ)⁻¹μ̄, the tilt caused by one view is c times its tilt at 100 %.
        Prior prior = HeLitterman.prior();
        double[] wPrior = unconstrained(prior, prior.excessReturns());
        double[] full = unconstrained(prior,
                Blend.posterior(prior, List.of(HeLitterman.canadaOverUsa().withConfidence(1)), 0.05).excessReturns());
        for (double c : new double[] {0.1, 0.5, 0.75}) {
            double[] w = unconstrained(prior, Blend.posterior(prior,
                    List.of(HeLitterman.canadaOverUsa().withConfidence(c)), 0.05).excessReturns());
            for (int i = 0; i < 7; i++) {
                assertEquals(c * (full[i] - wPrior[i]), w[i] - wPrior[i], Tolerances.CLOSED_FORM, "c = " + c);
            }
        }
    }

    @Test
    void theOptimumIsRebuiltFromThePriorWeightsAndTheViewWeights() {
        Xoshiro256PlusPlus g = new RandomStreams(8).stream(0);
        for (int trial = 0; trial < 40; trial++) {
            BlendCase bc = BlendCase.random(g, trial);
            Posterior post = Blend.posterior(bc.prior(), bc.views(), bc.tau());
            reconstructsTheOptimum(post);
        }
    }

    @Test
    void theRiskFreeRateCancelsFromTotalReturnsOfAGivenPrior() {
        double[][] sigma = HeLitterman.covariance();
        double[] mu = {0.06, 0.07, 0.08, 0.085, 0.05, 0.07, 0.075};
        List<View> views = List.of(View.absolute("Japan at 6 %", "Japan", 0.06).withConfidence(0.7),
                HeLitterman.canadaOverUsa());
        Posterior r0 = Blend.posterior(Prior.given(HeLitterman.ASSETS, sigma, mu, 0, 2.5), views, 0.05);
        Posterior r2 = Blend.posterior(Prior.given(HeLitterman.ASSETS, sigma, mu, 0.02, 2.5), views, 0.05);
        assertArrayEquals(r0.expectedReturns(), r2.expectedReturns(), Tolerances.TIGHT);
        Posterior exact = Blend.posterior(Prior.given(HeLitterman.ASSETS, sigma, mu, 0.02, Double.NaN),
                List.of(View.absolute("Japan at 6 %", "Japan", 0.06).withConfidence(1)), 0.05);
        assertEquals(0.06, exact.expectedReturns()[4], Tolerances.TIGHT, "an absolute view is a total return");
        assertNull(exact.optimalWeights());
        assertTrue(exact.viewWeights().isEmpty());
        assertTrue(Double.isNaN(exact.views().get(0).viewWeight()));
    }

    @Test
    void aSharpeRatioImpliesTheRiskAversionOverTheReferenceVolatility() {
        Prior byDelta = HeLitterman.prior();
        double sigma = byDelta.origin().referenceVolatility();
        // δ = SR/σ_ref: the Sharpe ratio 2.5·σ_ref gives δ = 2.5 (hand-derived from w'Π = δσ² = SR·σ).
        Prior bySharpe = Prior.impliedBySharpeRatio(HeLitterman.ASSETS, HeLitterman.covariance(), HeLitterman.WEIGHTS,
                2.5 * sigma, 0);
        assertEquals(2.5, bySharpe.riskAversion(), Tolerances.TIGHT);
        assertArrayEquals(byDelta.excessReturns(), bySharpe.excessReturns(), Tolerances.TIGHT);
        assertEquals(Prior.Kind.IMPLIED_BY_SHARPE_RATIO, bySharpe.origin().kind());
    }

    @Test
    void badInputIsRefusedNamingTheViewAndKey() {
        Prior prior = HeLitterman.prior();
        InputException unknown = assertThrows(InputException.class, () -> Blend.posterior(prior,
                List.of(View.relative("Mars over USA", "Mars", "USA", 0.01)), 0.05));
        assertEquals("key 'portfolio', asset 'Mars': view 'Mars over USA' names an asset that is not among the "
                + "assets; fix: use one of the assets of the covariance table: Australia, Canada, France, Germany, "
                + "Japan, UK, USA", unknown.getMessage());
        InputException self = assertThrows(InputException.class, () -> View.relative("USA over USA", "USA", "USA", 0));
        assertEquals("key 'portfolio', asset 'USA': view 'USA over USA' compares an asset with itself; fix: name two "
                + "different assets or groups", self.getMessage());
        InputException conf = assertThrows(InputException.class, () -> HeLitterman.canadaOverUsa().withConfidence(1.2));
        assertEquals("key 'confidence': view 'Canada over USA' has a confidence outside [0, 1] (value '1.2'); fix: "
                + "give a confidence between 0 and 1 (0.6 for 60 %; 1 makes the view hold exactly)", conf.getMessage());
        assertEquals("confidence", assertThrows(InputException.class,
                () -> HeLitterman.canadaOverUsa().withConfidence(-0.1)).key().orElseThrow());
        InputException var = assertThrows(InputException.class, () -> HeLitterman.canadaOverUsa().withVariance(-1e-4));
        assertEquals("variance", var.key().orElseThrow());
        assertTrue(var.problem().startsWith("view 'Canada over USA'"));
        assertEquals("confidence", assertThrows(InputException.class, () -> new View("both", Map.of("USA", 1.0), 0.05,
                0.5, 0.001)).key().orElseThrow());
        assertEquals("risk_aversion", assertThrows(InputException.class, () -> Prior.implied(HeLitterman.ASSETS,
                HeLitterman.covariance(), HeLitterman.WEIGHTS, 0, 0)).key().orElseThrow());
        assertEquals("risk_aversion", assertThrows(InputException.class, () -> Prior.implied(HeLitterman.ASSETS,
                HeLitterman.covariance(), HeLitterman.WEIGHTS, -2.5, 0)).key().orElseThrow());
        for (double tau : new double[] {0, -0.05, Double.NaN}) {
            assertEquals("tau", assertThrows(InputException.class,
                    () -> Blend.posterior(prior, List.of(), tau)).key().orElseThrow());
        }
        assertEquals("name", assertThrows(InputException.class, () -> Blend.posterior(prior,
                List.of(HeLitterman.canadaOverUsa(), HeLitterman.canadaOverUsa()), 0.05)).key().orElseThrow());
        assertEquals("portfolio", assertThrows(InputException.class,
                () -> View.of("nothing", Map.of("USA", 0.0), 0.01)).key().orElseThrow());
        double[][] indefinite = HeLitterman.covariance();
        indefinite[0][1] = indefinite[1][0] = 0.2; // a correlation above 1
        assertEquals("covariance", assertThrows(InputException.class, () -> Prior.given(HeLitterman.ASSETS,
                indefinite, new double[7], 0, 2.5)).key().orElseThrow());
    }

    /** w* = (w_prior + P'Λ)/(1 + τ), with w_prior = (δΣ)⁻¹Π, against the direct solve of (δ(Σ + M))w = μ̄. */
    static void reconstructsTheOptimum(Posterior post) {
        double[] w = post.priorOptimalWeights();
        double[] lambda = post.viewWeights().orElseThrow();
        for (int v = 0; v < lambda.length; v++) {
            double[] p = post.views().get(v).portfolio();
            for (int i = 0; i < w.length; i++) {
                w[i] += p[i] * lambda[v];
            }
        }
        double[] direct = post.optimalWeights();
        double scale = 0;
        for (double x : direct) {
            scale = Math.max(scale, Math.abs(x));
        }
        for (int i = 0; i < w.length; i++) {
            assertEquals(direct[i], w[i] / (1 + post.tau()), Tolerances.CLOSED_FORM * scale, "asset " + i);
        }
    }

    static double quad(Prior prior, View v) {
        double[] p = new double[prior.size()];
        v.portfolio().forEach((a, c) -> p[prior.assets().indexOf(a)] = c);
        return Prior.dot(p, Prior.times(prior.covariance(), p));
    }

    /** (δΣ)⁻¹μ by Commons Math's LU, independent of the blend's own solves. */
    static double[] unconstrained(Prior prior, double[] mu) {
        return new org.apache.commons.math3.linear.LUDecomposition(
                new org.apache.commons.math3.linear.Array2DRowRealMatrix(prior.covariance())).getSolver()
                .solve(new org.apache.commons.math3.linear.ArrayRealVector(mu)).mapDivide(prior.riskAversion())
                .toArray();
    }

    static double maxAbsDiff(double[] a, double[] b) {
        double m = 0;
        for (int i = 0; i < a.length; i++) {
            m = Math.max(m, Math.abs(a[i] - b[i]));
        }
        return m;
    }
}
