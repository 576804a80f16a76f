package org.isorisk.notebooks.pack;

import java.time.LocalDate;
import java.util.EnumSet;
import java.util.List;
import java.util.Objects;
import java.util.Optional;
import java.util.Set;
import org.isorisk.engine.error.InputException;

/**
 * What a committee pack shows, as read from the pack file (by the command line's pack use case): the fund, the
 * targets, the proposal, the charts and their formats. Numbers are decimals (0.055 is 5.5 %), annualised.
 *
 * @param fund           the fund's name, as the title shows it
 * @param currency       the currency the fund reports in (e.g. GBP), shown in the title and on amounts
 * @param note           a line under the title (e.g. "Invented fund; every figure is illustrative"); may be empty
 * @param asOf           the date the assumptions and holdings refer to
 * @param assumptionsNote how the assumptions were made, in words, for the assumptions section
 * @param targets        target expected returns, increasing, each solved under the mandate
 * @param proposed       the target the pack proposes (one of {@code targets})
 * @param riskFree       risk-free rate for the tangency portfolio and Sharpe ratios; empty when not given
 * @param frontierPoints portfolios sampled along the frontier for its table and chart (default 25)
 * @param charts         which charts to draw
 * @param chartFormats   which files to write for each chart (PNG is always written: the notebook embeds it)
 * @param fundSize       fund size in {@code currency}, for trade amounts when holdings are given; empty otherwise
 * @param scenarios      stress scenario file named in the pack file (relative to it), when stress is asked for
 */
public record PackSpec(String fund, String currency, String note, LocalDate asOf, String assumptionsNote,
                       List<Double> targets, double proposed, Optional<Double> riskFree, int frontierPoints,
                       Set<ChartChoice> charts, Set<ChartFormat> chartFormats, Optional<Double> fundSize,
                       Optional<String> scenarios) {

    /** Default number of frontier points: enough for a smooth curve, few enough for a readable table. */
    public static final int DEFAULT_FRONTIER_POINTS = 25;

    public PackSpec {
        Objects.requireNonNull(fund, "fund");
        Objects.requireNonNull(currency, "currency");
        note = note == null ? "" : note;
        Objects.requireNonNull(asOf, "asOf");
        assumptionsNote = assumptionsNote == null ? "" : assumptionsNote;
        targets = List.copyOf(targets);
        if (targets.isEmpty()) {
            throw InputException.of("the pack file names no target return").column("targets")
                    .fix("add e.g. targets: [0.045, 0.055] (decimals)").build();
        }
        if (!targets.contains(proposed)) {
            throw InputException.of("the proposed target is not one of the targets").column("proposed").value(proposed)
                    .fix("make proposed equal to one of targets").build();
        }
        riskFree = riskFree == null ? Optional.empty() : riskFree;
        if (frontierPoints < 2 || frontierPoints > 500) {
            throw InputException.of("frontier points must be between 2 and 500").column("frontier.points")
                    .value(frontierPoints).build();
        }
        charts = charts.isEmpty() ? EnumSet.noneOf(ChartChoice.class) : EnumSet.copyOf(charts);
        chartFormats = EnumSet.copyOf(chartFormats.isEmpty() ? EnumSet.of(ChartFormat.PNG) : chartFormats);
        chartFormats.add(ChartFormat.PNG);
        chartFormats.add(ChartFormat.SVG);
        fundSize = fundSize == null ? Optional.empty() : fundSize;
        scenarios = scenarios == null ? Optional.empty() : scenarios;
    }

    /** The same pack with the fund size set (e.g. the total market value of the holdings). */
    public PackSpec withFundSize(double size) {
        return new PackSpec(fund, currency, note, asOf, assumptionsNote, targets, proposed, riskFree, frontierPoints,
                charts, chartFormats, Optional.of(size), scenarios);
    }

    /** The pack file's values as JSON, for the manifest's parameters (decimals as numbers, dates as text). */
    public com.fasterxml.jackson.databind.node.ObjectNode toJson() {
        com.fasterxml.jackson.databind.node.ObjectNode o = com.fasterxml.jackson.databind.node.JsonNodeFactory.instance
                .objectNode();
        o.put("fund", fund);
        o.put("currency", currency);
        o.put("as_of", asOf.toString());
        com.fasterxml.jackson.databind.node.ArrayNode t = o.putArray("targets");
        targets.forEach(t::add);
        o.put("proposed", proposed);
        riskFree.ifPresent(r -> o.put("risk_free", r));
        o.put("frontier_points", frontierPoints);
        com.fasterxml.jackson.databind.node.ArrayNode c = o.putArray("charts");
        charts.forEach(x -> c.add(x.key()));
        com.fasterxml.jackson.databind.node.ArrayNode f = o.putArray("chart_formats");
        chartFormats.forEach(x -> f.add(x.extension()));
        fundSize.ifPresent(x -> o.put("fund_size", x));
        scenarios.ifPresent(x -> o.put("scenarios", x));
        return o;
    }

    /** A chart the pack can draw, by its name in the pack file. */
    public enum ChartChoice {
        FRONTIER("frontier"), WEIGHTS("weights"), MARGINAL_RISK("marginal-risk"),
        RISK_CONTRIBUTION("risk-contributions"), STRESS("stress");

        private final String key;

        ChartChoice(String key) {
            this.key = key;
        }

        public String key() {
            return key;
        }

        /** The chart of this name in the pack file, if any. */
        public static Optional<ChartChoice> of(String key) {
            for (ChartChoice c : values()) {
                if (c.key.equals(key)) {
                    return Optional.of(c);
                }
            }
            return Optional.empty();
        }
    }

    /** A chart file format; PNG and SVG are always written because the notebook embeds both. */
    public enum ChartFormat {
        PNG("png"), SVG("svg"), PDF("pdf");

        private final String extension;

        ChartFormat(String extension) {
            this.extension = extension;
        }

        public String extension() {
            return extension;
        }

        /** The format of this file extension in the pack file, if any. */
        public static Optional<ChartFormat> of(String key) {
            for (ChartFormat f : values()) {
                if (f.extension.equals(key)) {
                    return Optional.of(f);
                }
            }
            return Optional.empty();
        }
    }
}
