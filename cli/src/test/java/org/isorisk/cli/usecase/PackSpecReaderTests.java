package org.isorisk.cli.usecase;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.StringReader;
import java.time.LocalDate;
import java.util.EnumSet;
import java.util.List;
import java.util.Optional;
import org.isorisk.engine.error.InputException;
import org.isorisk.notebooks.pack.PackSpec;
import org.junit.jupiter.api.Test;

class PackSpecReaderTests {

    private static final String GOOD = """
            fund:
              name: Example Fund
              currency: GBP
              note: Invented.
            as_of: 2025-06-30
            targets: [0.045, 0.055, 0.065]
            proposed: 0.055
            risk_free: 0.025
            frontier: {points: 30}
            charts: [frontier, weights]
            chart_formats: [pdf]
            fund_size: 1250000000
            """;

    private static PackSpec read(String yaml) {
        return PackSpecReader.read(new StringReader(yaml), "pack.yaml");
    }

    private static String error(String yaml) {
        return assertThrows(InputException.class, () -> read(yaml)).getMessage();
    }

    @Test
    void aCompletePackFileIsReadWithEveryValue() {
        PackSpec s = read(GOOD);
        assertEquals("Example Fund", s.fund());
        assertEquals("GBP", s.currency());
        assertEquals("Invented.", s.note());
        assertEquals(LocalDate.of(2025, 6, 30), s.asOf());
        assertEquals(List.of(0.045, 0.055, 0.065), s.targets());
        assertEquals(0.055, s.proposed());
        assertEquals(Optional.of(0.025), s.riskFree());
        assertEquals(30, s.frontierPoints());
        assertEquals(EnumSet.of(PackSpec.ChartChoice.FRONTIER, PackSpec.ChartChoice.WEIGHTS), s.charts());
        assertEquals(EnumSet.allOf(PackSpec.ChartFormat.class), s.chartFormats(), "PNG and SVG are always written");
        assertEquals(Optional.of(1.25e9), s.fundSize());
    }

    @Test
    void theSampleFundsPackFileReads() {
        PackSpec s = PackSpecReader.read(java.nio.file.Path.of("..", "sample-data", "pack.yaml"));
        assertEquals("Fernhollow Regional Pension Scheme", s.fund());
        assertEquals(LocalDate.of(2025, 6, 30), s.asOf());
        assertTrue(s.note().contains("Invented"), "the sample fund is labelled invented");
        assertTrue(s.targets().contains(s.proposed()));
    }

    @Test
    void theProposalDefaultsToTheMiddleTargetAndChartsToTheFourStandardOnes() {
        PackSpec s = read("fund: {name: F, currency: EUR}\nas_of: 2025-01-31\ntargets: [0.03, 0.04, 0.05, 0.06]\n");
        assertEquals(0.04, s.proposed());
        assertEquals(4, s.charts().size());
        assertEquals(PackSpec.DEFAULT_FRONTIER_POINTS, s.frontierPoints());
    }

    @Test
    void anUnknownKeyIsNamedWithItsLine() {
        String m = error(GOOD + "targts: [0.05]\n");
        assertTrue(m.startsWith("pack.yaml, row 13, column 'targts': unknown key"), m);
        assertTrue(m.contains("fix: use one of"), m);
        String nested = error(GOOD.replace("  note: Invented.", "  nome: Invented."));
        assertTrue(nested.startsWith("pack.yaml, row 4, column 'fund.nome'"), nested);
    }

    @Test
    void aPercentWhereADecimalBelongsSaysHowToWriteIt() {
        String m = error(GOOD.replace("proposed: 0.055", "proposed: 5.5%"));
        assertTrue(m.contains("row 7, column 'proposed': not a number (value '5.5%')"), m);
        assertTrue(m.contains("5.5 % is 0.055"), m);
        String big = error(GOOD.replace("[0.045, 0.055, 0.065]", "[4.5, 5.5]"));
        assertTrue(big.contains("column 'targets': out of range (value '4.5')"), big);
    }

    @Test
    void targetsMustIncreaseAndTheProposalMustBeOneOfThem() {
        assertTrue(error(GOOD.replace("[0.045, 0.055, 0.065]", "[0.055, 0.045]")).contains("targets must increase"));
        assertTrue(error(GOOD.replace("[0.045, 0.055, 0.065]", "[0.055, 0.05505]")).contains("would read the same"));
        String m = error(GOOD.replace("proposed: 0.055", "proposed: 0.05"));
        assertTrue(m.contains("row 7, column 'proposed': the proposed target is not one of the targets"), m);
    }

    @Test
    void missingFundNameDateOrTargetsAreNamed() {
        assertTrue(error(GOOD.replace("  name: Example Fund\n", "")).contains("column 'fund.name': the pack file has no 'fund.name'"));
        assertTrue(error(GOOD.replace("as_of: 2025-06-30\n", "")).contains("no 'as_of'"));
        assertTrue(error(GOOD.replace("as_of: 2025-06-30", "as_of: 30/06/2025")).contains("write the date as YYYY-MM-DD"));
        assertTrue(error(GOOD.replace("targets: [0.045, 0.055, 0.065]\nproposed: 0.055\n", "")).contains("no 'targets'"));
    }

    @Test
    void unknownChartsFormatsAndBrokenYamlAreRefused() {
        assertTrue(error(GOOD.replace("[frontier, weights]", "[frontier, pie]")).contains("unknown chart (value 'pie')"));
        assertTrue(error(GOOD.replace("[pdf]", "[gif]")).contains("unknown chart format (value 'gif')"));
        assertTrue(error(GOOD.replace("[frontier, weights]", "[frontier, stress]")).contains("stress chart needs scenarios"));
        String dup = error(GOOD + "as_of: 2025-07-01\n");
        assertTrue(dup.contains("row 13, column 'as_of': key given twice"), dup);
        assertTrue(error("fund: [unclosed\n").contains("not valid YAML"));
        assertTrue(error("- just\n- a list\n").contains("must be a mapping"));
    }
}
