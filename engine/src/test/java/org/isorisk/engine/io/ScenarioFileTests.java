package org.isorisk.engine.io;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.StringReader;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.stress.Scenario;
import org.isorisk.engine.stress.Scope;
import org.isorisk.engine.stress.Shock;
import org.junit.jupiter.api.Test;

class ScenarioFileTests {

    static final List<String> ASSETS = List.of("Cash", "Government Bonds", "Inflation-Linked Bonds",
            "Investment-Grade Credit", "High Yield", "Emerging Market Debt", "Domestic Equity",
            "Foreign Developed Equity", "Emerging Equity", "Listed Real Estate", "Infrastructure", "Commodities");

    static List<Scenario> parse(String yaml) {
        return ScenarioFile.parse(new StringReader(yaml), "scenarios.yaml", null, ASSETS, Map.of(), null);
    }

    @Test
    void theSampleScenarioFileReadsWithItsGroupsAndShocks() {
        List<Scenario> s = ScenarioFile.read(Path.of("../sample-data/scenarios.yaml"), ASSETS, Map.of(), null);
        assertEquals(5, s.size());
        assertEquals("equity-volatility", s.get(0).name());
        Shock.VolatilityMultiplier v = (Shock.VolatilityMultiplier) s.get(0).shocks().get(0);
        assertEquals(1.5, v.factor());
        assertEquals(Scope.Kind.GROUP, v.scope().kind());
        assertEquals(List.of(6, 7, 8), v.scope().members());
        Shock.ReturnShift r = (Shock.ReturnShift) s.get(4).shocks().get(2);
        assertEquals(List.of(11), r.scope().members());
        assertEquals(0.02, r.delta());
    }

    @Test
    void aPolicyGroupCanBeAScope() {
        List<Scenario> s = ScenarioFile.parse(new StringReader("""
                scenarios:
                  - name: a
                    shocks:
                      - correlation: {scope: Bonds, towards_one: 0.5}
                """), "s.yaml", null, ASSETS, Map.of("Bonds", List.of(1, 2)), null);
        assertEquals(List.of(1, 2), ((Shock.CorrelationShift) s.get(0).shocks().get(0)).scope().members());
    }

    @Test
    void aBadValueIsReportedWithFileLineAndKey() {
        InputException e = assertThrows(InputException.class, () -> parse("""
                scenarios:
                  - name: a
                    shocks:
                      - volatility: {scope: all, multiplier: -2}
                """));
        assertEquals("scenarios.yaml: line 4, key 'volatility (scenario a)': a volatility multiplier must be a "
                + "positive number (value '-2.0'); fix: give e.g. 1.5 for volatilities 50 % higher", e.getMessage());
    }

    @Test
    void anUnknownScopeIsReportedWithItsLine() {
        InputException e = assertThrows(InputException.class, () -> parse("""
                scenarios:
                  - name: a
                    shocks:
                      - return: {scope: Equities, shift: -0.02}
                """));
        assertTrue(e.getMessage().startsWith("scenarios.yaml: line 4, key 'scope': 'Equities' is neither 'all', a "
                + "group nor an asset"), e.getMessage());
    }

    @Test
    void brokenYamlNamesTheLine() {
        InputException e = assertThrows(InputException.class, () -> parse("scenarios:\n  - name: a\n   shocks: [\n"));
        assertTrue(e.getMessage().startsWith("scenarios.yaml: line "), e.getMessage());
    }

    @Test
    void aPercentSignIsRefusedWithAFix() {
        InputException e = assertThrows(InputException.class, () -> parse("""
                scenarios:
                  - name: a
                    shocks:
                      - return: {scope: all, shift: -2%}
                """));
        assertTrue(e.getMessage().contains("line 4, key 'return.shift': expected a number, got '-2%'"),
                e.getMessage());
    }
}
