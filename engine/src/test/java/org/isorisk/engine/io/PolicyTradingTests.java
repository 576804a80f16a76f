package org.isorisk.engine.io;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.StringReader;
import java.util.List;
import java.util.Set;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.model.Policy;
import org.junit.jupiter.api.Test;

/** The policy's rebalancing section {@code trading:} (per-asset trade limits, minimum trade, no-trade list). */
class PolicyTradingTests {

    static final List<String> ASSETS = List.of("Cash", "Government Bonds", "Infrastructure");

    static Policy read(String yaml) {
        return PolicyReader.read(new StringReader(yaml), "policy.yaml", null, ASSETS);
    }

    @Test
    void theTradingSectionGivesTradeLimitsAMinimumTradeAndANoTradeList() {
        Policy p = read("""
                bounds: {default: {min: 0, max: 1}}
                turnover: {max: 0.2}
                trading:
                  max_trade: {default: 0.10, assets: {Infrastructure: 0.02}}
                  min_trade: 0.0025
                  no_trade: [Government Bonds]
                """);
        assertEquals(0.10, p.maxTrade()[0]);
        assertEquals(0.02, p.maxTrade()[2]);
        assertEquals(0.0025, p.minTrade());
        assertEquals(Set.of(1), p.noTrade());
    }

    @Test
    void withoutATradingSectionNothingIsLimitedBeyondTurnover() {
        Policy p = read("bounds: {default: {min: 0, max: 1}}\n");
        assertNull(p.maxTrade());
        assertEquals(0, p.minTrade());
        assertTrue(p.noTrade().isEmpty());
    }

    @Test
    void anUnknownAssetOnTheNoTradeListNamesTheLine() {
        InputException e = assertThrows(InputException.class, () -> read("""
                bounds: {default: {min: 0, max: 1}}
                trading:
                  no_trade: [Gold]
                """));
        assertTrue(e.getMessage().startsWith("policy.yaml, line 3"), e.getMessage());
        assertTrue(e.getMessage().contains("Gold"), e.getMessage());
    }

    @Test
    void aMinimumTradeWrittenAsPercentIsRefused() {
        InputException e = assertThrows(InputException.class, () -> read("""
                trading:
                  min_trade: 0.25%
                """));
        assertTrue(e.getMessage().contains("trading.min_trade"), e.getMessage());
    }
}
