package org.isorisk.cli.render;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.io.StringWriter;
import java.util.List;
import org.isorisk.cli.json.ResultJson;
import org.isorisk.engine.estimate.CovarianceMethod;
import org.isorisk.engine.estimate.Estimate;
import org.isorisk.engine.estimate.EstimationSettings;
import org.isorisk.engine.estimate.Estimator;
import org.isorisk.engine.estimate.History;
import org.isorisk.engine.estimate.ValueKind;
import org.isorisk.engine.explain.Caution;
import org.junit.jupiter.api.Test;

class EstimateReportTests {

    @Test
    void theReportsCarryTheCautionAndParseBack() throws IOException {
        double[][] p = new double[60][2];
        java.time.LocalDate[] d = new java.time.LocalDate[60];
        java.util.Random rnd = new java.util.Random(3);
        for (int t = 0; t < 60; t++) {
            d[t] = java.time.LocalDate.of(2015, 1, 31).plusMonths(t);
            p[t][0] = 100 * Math.exp(0.01 * t + 0.03 * rnd.nextGaussian());
            p[t][1] = 50 * Math.exp(0.005 * t + 0.05 * rnd.nextGaussian());
        }
        History h = new History("m.csv", List.of("Bonds", "Equity"), d, null, p, ValueKind.PRICES);
        Estimate e = Estimator.estimate(h, EstimationSettings.defaults()
                .withMethod(CovarianceMethod.LEDOIT_WOLF_CONSTANT_CORRELATION), null);
        StringWriter text = new StringWriter();
        EstimateReport.text(text, e, 50);
        assertTrue(text.toString().contains("frequency:      monthly (detected from the dates"), text.toString());
        assertTrue(text.toString().contains("12 periods a year"));
        assertTrue(text.toString().contains("Caution: " + Caution.TEXT));
        StringWriter json = new StringWriter();
        ResultJson.write(EstimateReport.json(e), json);
        JsonNode n = new ObjectMapper().readTree(json.toString());
        assertEquals(Caution.TEXT, n.get("caution").asText());
        assertEquals(e.shrinkage().intensity(), n.at("/method/shrinkage_intensity").asDouble(), 0);
        assertEquals(e.after().smallest(), n.at("/conditioning/after/smallest_eigenvalue").asDouble(), 0);
        assertEquals("historical-mean", n.at("/issues/0/code").asText());
        assertEquals(e.expectedReturns()[1], n.at("/assets/1/expected_return").asDouble(), 0);
    }
}
