package org.isorisk.engine.estimate;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.LinkedHashMap;
import java.util.Map;
import org.apache.commons.math3.linear.Array2DRowRealMatrix;
import org.apache.commons.math3.linear.CholeskyDecomposition;
import org.apache.commons.math3.stat.correlation.Covariance;
import org.apache.commons.math3.stat.descriptive.moment.Mean;
import org.isorisk.engine.Tolerances;
import org.junit.jupiter.api.Test;

class EstimatorTests {

    private static double[][] simpleReturnsOf(double[][] p) {
        double[][] r = new double[p.length - 1][p[0].length];
        for (int t = 1; t < p.length; t++) {
            for (int j = 0; j < p[0].length; j++) {
                r[t - 1][j] = p[t][j] / p[t - 1][j] - 1;
            }
        }
        return r;
    }

    @Test
    void sampleCovarianceAndMeansMatchCommonsMathAnnualisedWith252() {
        History h = Histories.priceHistory(400, 6, 11);
        Estimate e = Estimator.estimate(h, EstimationSettings.defaults(), new MeanSpec.Historical());
        assertEquals(Frequency.DAILY, e.frequency());
        assertTrue(e.frequencyDetected());
        assertEquals(252, e.periodsPerYear());
        double[][] r = simpleReturnsOf(h.values());
        // Apache Commons Math: Covariance (bias-corrected, n - 1) and Mean, an independent implementation.
        double[][] ref = new Covariance(r).getCovarianceMatrix().getData();
        double[][] cols = Histories.columns(r);
        for (int i = 0; i < 6; i++) {
            assertEquals(new Mean().evaluate(cols[i]) * 252, e.expectedReturns()[i], Tolerances.TIGHT);
            for (int j = 0; j < 6; j++) {
                assertEquals(ref[i][j] * 252, e.covariance(i, j), Tolerances.TIGHT * 252);
            }
        }
        assertEquals(399, e.observations().used());
        assertEquals(h.date(1), e.observations().first());
        assertEquals(h.date(399), e.observations().last());
        assertNull(e.shrinkage());
        assertEquals(e.before(), e.after());
    }

    @Test
    void logReturnsAndAnotherPeriodsPerYearAnnualiseMeansAndCovariancesAlike() {
        History h = Histories.priceHistory(300, 4, 12);
        EstimationSettings s = EstimationSettings.defaults().withReturnType(ReturnType.LOG).withPeriodsPerYear(260);
        Estimate e = Estimator.estimate(h, s, new MeanSpec.Historical());
        double[][] p = h.values();
        double[][] r = new double[p.length - 1][4];
        for (int t = 1; t < p.length; t++) {
            for (int j = 0; j < 4; j++) {
                r[t - 1][j] = Math.log(p[t][j] / p[t - 1][j]);
            }
        }
        // Apache Commons Math on log returns, scaled by 260 for both mean and covariance.
        double[][] ref = new Covariance(r).getCovarianceMatrix().getData();
        double[][] cols = Histories.columns(r);
        for (int i = 0; i < 4; i++) {
            assertEquals(new Mean().evaluate(cols[i]) * 260, e.expectedReturns()[i], Tolerances.TIGHT);
            for (int j = 0; j < 4; j++) {
                assertEquals(ref[i][j] * 260, e.covariance(i, j), Tolerances.TIGHT);
            }
        }
        assertEquals(260, e.periodsPerYear());
        assertEquals(ReturnType.LOG, e.returnType());
    }

    @Test
    void returnHistoriesAreUsedAsGiven() {
        History h = Histories.returnHistory(120, 3, 13);
        Estimate e = Estimator.estimate(h, EstimationSettings.defaults().withFrequency(Frequency.DAILY),
                new MeanSpec.Historical());
        double[][] ref = new Covariance(h.values()).getCovarianceMatrix().getData();
        for (int i = 0; i < 3; i++) {
            for (int j = 0; j < 3; j++) {
                assertEquals(ref[i][j] * 252, e.covariance(i, j), Tolerances.TIGHT);
            }
        }
        assertEquals(120, e.observations().used());
        assertEquals(h.date(0), e.observations().first());
    }

    @Test
    void ewmaPutsWeightLambdaToTheKOnTheReturnKPeriodsBack() {
        History h = Histories.returnHistory(250, 3, 14);
        double lambda = 0.97;
        Estimate e = Estimator.estimate(h, EstimationSettings.defaults().withDecay(lambda),
                new MeanSpec.Historical());
        // Written out from the definition (RiskMetrics Technical Document (1996), weights (1 − λ)λ^k, here
        // normalised over the finite window and centred on the weighted mean).
        double[][] r = h.values();
        int len = r.length;
        double[] w = new double[len];
        double sw = 0;
        for (int t = 0; t < len; t++) {
            w[t] = Math.pow(lambda, len - 1 - t);
            sw += w[t];
        }
        double[] m = new double[3];
        for (int j = 0; j < 3; j++) {
            for (int t = 0; t < len; t++) {
                m[j] += w[t] / sw * r[t][j];
            }
        }
        for (int i = 0; i < 3; i++) {
            for (int j = 0; j < 3; j++) {
                double s = 0;
                for (int t = 0; t < len; t++) {
                    s += w[t] / sw * (r[t][i] - m[i]) * (r[t][j] - m[j]);
                }
                assertEquals(s * 252, e.covariance(i, j), Tolerances.TIGHT);
            }
        }
        assertEquals(lambda, e.decay(), 0);
    }

    @Test
    void ewmaDefaultsToTheRiskMetricsDailyDecayAndAHalfLifeHalvesTheWeight() {
        History h = Histories.priceHistory(200, 2, 15);
        EstimationSettings ewma = EstimationSettings.defaults().withMethod(CovarianceMethod.EWMA);
        // RiskMetrics Technical Document (1996): λ = 0.94 for daily data.
        assertEquals(0.94, Estimator.estimate(h, ewma, null).decay(), 0);
        double lambda = Estimator.estimate(h, EstimationSettings.defaults().withHalfLife(30), null).decay();
        assertEquals(0.5, Math.pow(lambda, 30), Tolerances.TIGHT);
    }

    @Test
    void ewmaWithDecayNearOneTendsToTheSampleCovarianceWithDivisorT() {
        History h = Histories.returnHistory(150, 3, 16);
        Estimate e = Estimator.estimate(h, EstimationSettings.defaults().withDecay(1 - 1e-12), null);
        double[][] ref = new Covariance(h.values()).getCovarianceMatrix().getData();
        for (int i = 0; i < 3; i++) {
            for (int j = 0; j < 3; j++) {
                assertEquals(ref[i][j] * 149.0 / 150.0 * 252, e.covariance(i, j), 1e-9 * Math.abs(ref[i][j] * 252) + 1e-15);
            }
        }
    }

    @Test
    void ledoitWolfIdentityMatchesTheJmvaFormulasWrittenOut() {
        History h = Histories.returnHistory(60, 8, 17);
        Estimate e = Estimator.estimate(h, EstimationSettings.defaults().withMethod(
                CovarianceMethod.LEDOIT_WOLF_IDENTITY).withFrequency(Frequency.DAILY), null);
        // Ledoit & Wolf (2004), JMVA 88, Lemmas 3.2-3.4 sample counterparts, with ‖A‖² = tr(AA')/N, literally.
        double[][] x = centred(h.values());
        int len = x.length;
        int n = 8;
        double[][] s = new double[n][n];
        for (double[] xt : x) {
            for (int i = 0; i < n; i++) {
                for (int j = 0; j < n; j++) {
                    s[i][j] += xt[i] * xt[j] / len;
                }
            }
        }
        double m = 0;
        for (int i = 0; i < n; i++) {
            m += s[i][i] / n;
        }
        double d2 = 0;
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                double v = s[i][j] - (i == j ? m : 0);
                d2 += v * v / n;
            }
        }
        double bBar2 = 0;
        for (double[] xt : x) {
            double sq = 0;
            for (int i = 0; i < n; i++) {
                for (int j = 0; j < n; j++) {
                    double v = xt[i] * xt[j] - s[i][j];
                    sq += v * v / n;
                }
            }
            bBar2 += sq / ((double) len * len);
        }
        double b2 = Math.min(bBar2, d2);
        double intensity = b2 / d2;
        assertEquals(intensity, e.shrinkage().intensity(), Tolerances.CLOSED_FORM);
        assertTrue(intensity > 0 && intensity < 1, "a 60 × 8 sample should be shrunk partly: " + intensity);
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                double ref = intensity * (i == j ? m : 0) + (1 - intensity) * s[i][j];
                assertEquals(ref * 252, e.covariance(i, j), Tolerances.CLOSED_FORM * 1e-2);
            }
        }
        assertEquals("scaled identity", e.shrinkage().target());
        assertTrue(e.after().conditionNumber() < e.before().conditionNumber());
    }

    @Test
    void ledoitWolfConstantCorrelationMatchesTheJpmFormulasWrittenOut() {
        History h = Histories.returnHistory(80, 7, 18);
        Estimate e = Estimator.estimate(h, EstimationSettings.defaults().withMethod(
                CovarianceMethod.LEDOIT_WOLF_CONSTANT_CORRELATION).withFrequency(Frequency.DAILY), null);
        // Ledoit & Wolf (2004), "Honey, I shrunk the sample covariance matrix", JPM 30(4), Appendix: π̂, ρ̂, γ̂,
        // κ̂ and δ* = max(0, min(κ̂/T, 1)), each sum written out over t.
        double[][] x = centred(h.values());
        int len = x.length;
        int n = 7;
        double[][] s = new double[n][n];
        for (double[] xt : x) {
            for (int i = 0; i < n; i++) {
                for (int j = 0; j < n; j++) {
                    s[i][j] += xt[i] * xt[j] / len;
                }
            }
        }
        double rBar = 0;
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                if (i != j) {
                    rBar += s[i][j] / Math.sqrt(s[i][i] * s[j][j]) / (n * (n - 1.0));
                }
            }
        }
        double[][] f = new double[n][n];
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                f[i][j] = i == j ? s[i][i] : rBar * Math.sqrt(s[i][i] * s[j][j]);
            }
        }
        double[][] piM = new double[n][n];
        double pi = 0;
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                for (double[] xt : x) {
                    double v = xt[i] * xt[j] - s[i][j];
                    piM[i][j] += v * v / len;
                }
                pi += piM[i][j];
            }
        }
        double rho = 0;
        for (int i = 0; i < n; i++) {
            rho += piM[i][i];
        }
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                if (i == j) {
                    continue;
                }
                double thetaIi = 0;
                double thetaJj = 0;
                for (double[] xt : x) {
                    thetaIi += (xt[i] * xt[i] - s[i][i]) * (xt[i] * xt[j] - s[i][j]) / len;
                    thetaJj += (xt[j] * xt[j] - s[j][j]) * (xt[i] * xt[j] - s[i][j]) / len;
                }
                rho += rBar / 2 * (Math.sqrt(s[j][j] / s[i][i]) * thetaIi + Math.sqrt(s[i][i] / s[j][j]) * thetaJj);
            }
        }
        double gamma = 0;
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                gamma += (f[i][j] - s[i][j]) * (f[i][j] - s[i][j]);
            }
        }
        double kappa = (pi - rho) / gamma;
        double delta = Math.max(0, Math.min(kappa / len, 1));
        assertEquals(delta, e.shrinkage().intensity(), Tolerances.CLOSED_FORM);
        assertTrue(delta > 0 && delta < 1, "an 80 × 7 sample should be shrunk partly: " + delta);
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                double ref = delta * f[i][j] + (1 - delta) * s[i][j];
                assertEquals(ref * 252, e.covariance(i, j), Tolerances.CLOSED_FORM * 1e-2);
            }
        }
        assertEquals("constant correlation", e.shrinkage().target());
    }

    @Test
    void withFewerReturnsThanAssetsShrinkageStaysPositiveDefiniteWhileTheSampleIsSingular() {
        History h = Histories.returnHistory(30, 40, 19);
        EstimationSettings daily = EstimationSettings.defaults().withFrequency(Frequency.DAILY);
        Estimate sample = Estimator.estimate(h, daily, null);
        assertTrue(sample.after().smallest() < 1e-12 * sample.after().largest(),
                "rank at most 29: " + sample.after().smallest());
        for (CovarianceMethod m : new CovarianceMethod[] {CovarianceMethod.LEDOIT_WOLF_IDENTITY,
                CovarianceMethod.LEDOIT_WOLF_CONSTANT_CORRELATION}) {
            Estimate e = Estimator.estimate(h, daily.withMethod(m), null);
            assertTrue(e.after().smallest() > 0, m + ": " + e.after());
            new CholeskyDecomposition(new Array2DRowRealMatrix(e.covariance())); // Commons Math accepts it as SPD
            assertTrue(e.after().conditionNumber() < 1e6, m + ": " + e.after().conditionNumber());
        }
    }

    @Test
    void impliedReturnsFromARiskAversionAreDeltaTimesSigmaTimesTheReferenceWeights() {
        History h = Histories.priceHistory(500, 4, 20);
        Map<String, Double> w = new LinkedHashMap<>();
        double[] wRef = {0.4, 0.3, 0.2, 0.1};
        for (int j = 0; j < 4; j++) {
            w.put(h.assets().get(j), wRef[j]);
        }
        Estimate e = Estimator.estimate(h, EstimationSettings.defaults(),
                new MeanSpec.Implied(w, 2.5, Double.NaN, 0.02, "reference.csv"));
        double[][] sigma = e.covariance();
        for (int i = 0; i < 4; i++) {
            double sw = 0;
            for (int j = 0; j < 4; j++) {
                sw += sigma[i][j] * wRef[j];
            }
            assertEquals(0.02 + 2.5 * sw, e.expectedReturns()[i], Tolerances.TIGHT);
        }
        // Reverse optimisation round trip: max w'π − (δ/2) w'Σw is attained at w = Σ⁻¹π/δ = w_ref.
        double[] pi = new double[4];
        for (int i = 0; i < 4; i++) {
            pi[i] = (e.expectedReturns()[i] - 0.02) / 2.5;
        }
        double[] back = new CholeskyDecomposition(new Array2DRowRealMatrix(sigma)).getSolver()
                .solve(new org.apache.commons.math3.linear.ArrayRealVector(pi)).toArray();
        for (int i = 0; i < 4; i++) {
            assertEquals(wRef[i], back[i], Tolerances.CLOSED_FORM);
        }
        assertEquals("implied", e.mean().kind());
        assertEquals(2.5, e.mean().riskAversion(), 0);
    }

    @Test
    void aMarketSharpeRatioImpliesDeltaSoThatTheReferenceEarnsThatSharpeRatio() {
        History h = Histories.priceHistory(500, 4, 21);
        Map<String, Double> w = new LinkedHashMap<>();
        double[] wRef = {0.25, 0.25, 0.25, 0.25};
        for (int j = 0; j < 4; j++) {
            w.put(h.assets().get(j), wRef[j]);
        }
        Estimate e = Estimator.estimate(h, EstimationSettings.defaults(),
                new MeanSpec.Implied(w, Double.NaN, 0.4, 0.01, "reference.csv"));
        double var = 0;
        double excess = 0;
        for (int i = 0; i < 4; i++) {
            excess += wRef[i] * (e.expectedReturns()[i] - 0.01);
            for (int j = 0; j < 4; j++) {
                var += wRef[i] * e.covariance(i, j) * wRef[j];
            }
        }
        double sigmaRef = Math.sqrt(var);
        // δ = SR / σ_ref, hence w_ref'π = δ σ_ref² = SR σ_ref.
        assertEquals(0.4 / sigmaRef, e.mean().riskAversion(), Tolerances.TIGHT * 100);
        assertEquals(0.4, excess / sigmaRef, Tolerances.TIGHT * 100);
        assertEquals(sigmaRef, e.mean().referenceVolatility(), Tolerances.TIGHT);
    }

    @Test
    void suppliedExpectedReturnsAreUsedAsGiven() {
        History h = Histories.priceHistory(100, 3, 22);
        Map<String, Double> mu = new LinkedHashMap<>();
        mu.put(h.assets().get(2), 0.07);
        mu.put(h.assets().get(0), 0.05);
        mu.put(h.assets().get(1), 0.06);
        Estimate e = Estimator.estimate(h, EstimationSettings.defaults(), new MeanSpec.Supplied(mu, "mu.csv"));
        assertEquals(0.05, e.expectedReturns()[0], 0);
        assertEquals(0.06, e.expectedReturns()[1], 0);
        assertEquals(0.07, e.expectedReturns()[2], 0);
        assertTrue(e.issues().stream().noneMatch(i -> i.code() == Issue.Code.HISTORICAL_MEAN));
    }

    @Test
    void historicalMeansCarryTheirStandardErrorsVolatilityOverRootYears() {
        History h = Histories.priceHistory(505, 3, 23);
        Estimate e = Estimator.estimate(h, EstimationSettings.defaults(), null);
        double years = 504 / 252.0;
        for (int j = 0; j < 3; j++) {
            assertEquals(Math.sqrt(e.covariance(j, j)) / Math.sqrt(years), e.mean().standardErrors()[j],
                    Tolerances.TIGHT);
        }
        assertEquals(years, e.mean().years(), Tolerances.TIGHT);
    }

    @Test
    void monthlyAndQuarterlyDatesAnnualiseWith12And4() {
        java.time.LocalDate[] months = new java.time.LocalDate[40];
        java.time.LocalDate[] quarters = new java.time.LocalDate[40];
        for (int t = 0; t < 40; t++) {
            months[t] = java.time.LocalDate.of(2010, 1, 31).plusMonths(t);
            quarters[t] = java.time.LocalDate.of(2010, 3, 31).plusMonths(3L * t);
        }
        double[][] r = Histories.returns(40, 2, 24);
        Estimate m = Estimator.estimate(new History("m.csv", Histories.names(2), months, null, r, ValueKind.RETURNS),
                EstimationSettings.defaults(), null);
        Estimate q = Estimator.estimate(new History("q.csv", Histories.names(2), quarters, null, r, ValueKind.RETURNS),
                EstimationSettings.defaults(), null);
        assertEquals(Frequency.MONTHLY, m.frequency());
        assertEquals(12, m.periodsPerYear());
        assertEquals(Frequency.QUARTERLY, q.frequency());
        assertEquals(4, q.periodsPerYear());
        assertEquals(m.covariance(0, 1) / 12, q.covariance(0, 1) / 4, Tolerances.TIGHT);
    }

    static double[][] centred(double[][] r) {
        int len = r.length;
        int n = r[0].length;
        double[] m = new double[n];
        for (double[] rt : r) {
            for (int j = 0; j < n; j++) {
                m[j] += rt[j] / len;
            }
        }
        double[][] x = new double[len][n];
        for (int t = 0; t < len; t++) {
            for (int j = 0; j < n; j++) {
                x[t][j] = r[t][j] - m[j];
            }
        }
        return x;
    }
}
