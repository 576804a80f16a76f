package org.isorisk.cli.usecase;

import java.io.IOException;
import java.io.Reader;
import java.io.StringReader;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.LocalDate;
import java.time.format.DateTimeParseException;
import java.util.ArrayList;
import java.util.EnumSet;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import org.isorisk.engine.error.InputException;
import org.isorisk.notebooks.pack.PackSpec;
import org.yaml.snakeyaml.LoaderOptions;
import org.yaml.snakeyaml.Yaml;
import org.yaml.snakeyaml.error.MarkedYAMLException;
import org.yaml.snakeyaml.nodes.MappingNode;
import org.yaml.snakeyaml.nodes.Node;
import org.yaml.snakeyaml.nodes.NodeTuple;
import org.yaml.snakeyaml.nodes.ScalarNode;
import org.yaml.snakeyaml.nodes.SequenceNode;

/**
 * Reads the pack file, a small YAML file of isorisk's own (documented in README.md, "The pack file"), into the
 * {@link PackSpec} the pack's analyses and its layout both follow. Every error names the file, the line and the key,
 * and says what would fix it; unknown keys are errors too, so a misspelt key is never silently ignored.
 *
 * <p>It lives with the pack use case rather than among the engine's readers: the pack file says which analyses
 * and charts a pack wants, a question of the command line's use case, while {@code engine.io} reads the inputs of
 * the analyses themselves (assumptions, policy, holdings, histories, scenarios) that several commands share.
 */
public final class PackSpecReader {
    private PackSpecReader() {
    }

    /** Targets closer than this would share a label (percentages are shown with two decimals). */
    static final double MIN_TARGET_GAP = 0.0001 - 1e-12;

    private static final Set<String> TOP = Set.of("fund", "as_of", "assumptions_note", "targets", "proposed",
            "risk_free", "frontier", "charts", "chart_formats", "fund_size", "scenarios");

    /** Reads the pack file at {@code path}. */
    public static PackSpec read(Path path) {
        String text;
        try {
            text = Files.readString(path, StandardCharsets.UTF_8);
        } catch (IOException e) {
            throw InputException.of("cannot read the pack file").file(path.toString())
                    .value(e.getClass().getSimpleName()).fix("check the path given to --pack-file").build();
        }
        return read(new StringReader(text), path.toString());
    }

    /** Reads a pack file from {@code in}; {@code file} names it in errors. */
    public static PackSpec read(Reader in, String file) {
        Node root;
        try {
            LoaderOptions options = new LoaderOptions();
            options.setAllowDuplicateKeys(false);
            options.setMaxAliasesForCollections(10);
            root = new Yaml(options).compose(in);
        } catch (MarkedYAMLException e) {
            int line = e.getProblemMark() == null ? 0 : e.getProblemMark().getLine() + 1;
            throw InputException.of("the pack file is not valid YAML: " + oneLine(e.getProblem())).file(file)
                    .row(line).fix("correct the YAML at that line").build();
        } catch (RuntimeException e) {
            throw InputException.of("the pack file is not valid YAML: " + oneLine(e.getMessage())).file(file)
                    .fix("correct the YAML").build();
        }
        if (!(root instanceof MappingNode map)) {
            throw InputException.of("the pack file must be a mapping of keys (fund:, targets:, ...)").file(file)
                    .fix("see README.md, section 'The pack file'").build();
        }
        Ctx ctx = new Ctx(file);
        Map<String, Node> top = ctx.keys(map, "", TOP);

        Node fundNode = ctx.required(top, "fund", map, "");
        Map<String, Node> fund = ctx.keys(ctx.mapping(fundNode, "fund"), "fund.", Set.of("name", "currency", "note"));
        String name = ctx.text(ctx.required(fund, "name", fundNode, "fund."), "fund.name");
        String currency = ctx.text(ctx.required(fund, "currency", fundNode, "fund."), "fund.currency");
        String note = fund.containsKey("note") ? ctx.text(fund.get("note"), "fund.note") : "";

        LocalDate asOf = ctx.date(ctx.required(top, "as_of", map, ""), "as_of");
        String assumptionsNote = top.containsKey("assumptions_note")
                ? ctx.text(top.get("assumptions_note"), "assumptions_note") : "";

        Node targetsNode = ctx.required(top, "targets", map, "");
        List<Double> targets = new ArrayList<>();
        for (Node t : ctx.sequence(targetsNode, "targets")) {
            double v = ctx.decimal(t, "targets", -1, 1);
            if (!targets.isEmpty() && v <= targets.get(targets.size() - 1)) {
                throw ctx.error(t, "targets", "targets must increase").value(v).fix("list the targets from low to high, each once").build();
            }
            if (!targets.isEmpty() && v - targets.get(targets.size() - 1) < MIN_TARGET_GAP) {
                throw ctx.error(t, "targets", "targets closer than 0.01 % would read the same in the pack").value(v)
                        .fix("keep the targets at least 0.0001 apart").build();
            }
            targets.add(v);
        }
        if (targets.isEmpty()) {
            throw ctx.error(targetsNode, "targets", "the list of targets is empty").fix("add e.g. targets: [0.045, 0.055]").build();
        }
        double proposed = top.containsKey("proposed") ? ctx.decimal(top.get("proposed"), "proposed", -1, 1)
                : targets.get((targets.size() - 1) / 2);
        if (!targets.contains(proposed)) {
            throw ctx.error(top.get("proposed"), "proposed", "the proposed target is not one of the targets")
                    .value(proposed).fix("make proposed equal to one of " + targets).build();
        }
        Optional<Double> riskFree = top.containsKey("risk_free")
                ? Optional.of(ctx.decimal(top.get("risk_free"), "risk_free", -1, 1)) : Optional.empty();

        int points = PackSpec.DEFAULT_FRONTIER_POINTS;
        if (top.containsKey("frontier")) {
            Map<String, Node> fr = ctx.keys(ctx.mapping(top.get("frontier"), "frontier"), "frontier.", Set.of("points"));
            if (fr.containsKey("points")) {
                points = ctx.integer(fr.get("points"), "frontier.points", 2, 500);
            }
        }

        Set<PackSpec.ChartChoice> charts = EnumSet.noneOf(PackSpec.ChartChoice.class);
        if (top.containsKey("charts")) {
            for (Node c : ctx.sequence(top.get("charts"), "charts")) {
                String key = ctx.text(c, "charts");
                charts.add(PackSpec.ChartChoice.of(key).orElseThrow(() -> ctx.error(c, "charts", "unknown chart")
                        .value(key).fix("use frontier, weights, marginal-risk, risk-contributions or stress").build()));
            }
        } else {
            charts.addAll(EnumSet.of(PackSpec.ChartChoice.FRONTIER, PackSpec.ChartChoice.WEIGHTS,
                    PackSpec.ChartChoice.MARGINAL_RISK, PackSpec.ChartChoice.RISK_CONTRIBUTION));
        }
        Set<PackSpec.ChartFormat> formats = EnumSet.of(PackSpec.ChartFormat.PNG, PackSpec.ChartFormat.SVG);
        if (top.containsKey("chart_formats")) {
            for (Node c : ctx.sequence(top.get("chart_formats"), "chart_formats")) {
                String key = ctx.text(c, "chart_formats");
                formats.add(PackSpec.ChartFormat.of(key).orElseThrow(() -> ctx.error(c, "chart_formats",
                        "unknown chart format").value(key).fix("use png, svg or pdf").build()));
            }
        }
        Optional<Double> fundSize = top.containsKey("fund_size")
                ? Optional.of(ctx.decimal(top.get("fund_size"), "fund_size", 0, Double.MAX_VALUE)) : Optional.empty();
        if (fundSize.isPresent() && fundSize.get() <= 0) {
            throw ctx.error(top.get("fund_size"), "fund_size", "the fund size must be positive").value(fundSize.get())
                    .fix("give the fund's value in " + currency).build();
        }
        Optional<String> scenarios = top.containsKey("scenarios")
                ? Optional.of(ctx.text(top.get("scenarios"), "scenarios")) : Optional.empty();
        if (charts.contains(PackSpec.ChartChoice.STRESS) && scenarios.isEmpty()) {
            throw ctx.error(top.get("charts"), "charts", "the stress chart needs scenarios")
                    .fix("add scenarios: FILE, or drop stress from charts").build();
        }
        return new PackSpec(name, currency, note, asOf, assumptionsNote, targets, proposed, riskFree, points, charts,
                formats, fundSize, scenarios);
    }

    private static String oneLine(String s) {
        return s == null ? "" : s.replaceAll("\\s+", " ").trim();
    }

    /** Reading context: the file name for errors, and typed access to nodes with their line numbers. */
    private record Ctx(String file) {

        InputException.Builder error(Node n, String key, String problem) {
            InputException.Builder b = InputException.of(problem).file(file).column(key);
            if (n != null && n.getStartMark() != null) {
                b.row(n.getStartMark().getLine() + 1);
            }
            return b;
        }

        Map<String, Node> keys(MappingNode map, String prefix, Set<String> allowed) {
            Map<String, Node> out = new LinkedHashMap<>();
            for (NodeTuple t : map.getValue()) {
                String k = t.getKeyNode() instanceof ScalarNode s ? s.getValue() : null;
                if (k == null || !allowed.contains(k)) {
                    throw error(t.getKeyNode(), prefix + (k == null ? "?" : k), "unknown key in the pack file")
                            .fix("use one of " + String.join(", ", allowed.stream().sorted().toList())).build();
                }
                if (out.put(k, t.getValueNode()) != null) {
                    throw error(t.getKeyNode(), prefix + k, "key given twice in the pack file")
                            .fix("keep one " + prefix + k).build();
                }
            }
            return out;
        }

        Node required(Map<String, Node> m, String key, Node parent, String prefix) {
            Node n = m.get(key);
            if (n == null) {
                throw error(parent, prefix + key, "the pack file has no '" + prefix + key + "'")
                        .fix("add " + prefix + key + ": (see README.md, section 'The pack file')").build();
            }
            return n;
        }

        MappingNode mapping(Node n, String key) {
            if (n instanceof MappingNode m) {
                return m;
            }
            throw error(n, key, "expected keys under '" + key + "'").fix("indent the keys under " + key + ":").build();
        }

        List<Node> sequence(Node n, String key) {
            if (n instanceof SequenceNode s) {
                return s.getValue();
            }
            if (n instanceof ScalarNode) {
                return List.of(n);
            }
            throw error(n, key, "expected a list").fix("write " + key + ": [a, b]").build();
        }

        String text(Node n, String key) {
            if (n instanceof ScalarNode s && !s.getValue().isBlank()) {
                return s.getValue().strip();
            }
            throw error(n, key, "expected text").fix("give " + key + " a value").build();
        }

        double decimal(Node n, String key, double lo, double hi) {
            String s = text(n, key);
            double v;
            try {
                v = Double.parseDouble(s);
            } catch (NumberFormatException e) {
                throw error(n, key, "not a number").value(s)
                        .fix(s.contains("%") ? "write decimals: 5.5 % is 0.055" : "write a plain decimal number").build();
            }
            if (!Double.isFinite(v) || v < lo || v > hi) {
                throw error(n, key, "out of range").value(s).fix("give a decimal between " + lo + " and " + hi
                        + (hi == 1 ? " (5.5 % is 0.055)" : "")).build();
            }
            return v;
        }

        int integer(Node n, String key, int lo, int hi) {
            String s = text(n, key);
            try {
                int v = Integer.parseInt(s);
                if (v >= lo && v <= hi) {
                    return v;
                }
            } catch (NumberFormatException e) {
                // reported below
            }
            throw error(n, key, "expected a whole number between " + lo + " and " + hi).value(s).build();
        }

        LocalDate date(Node n, String key) {
            String s = text(n, key);
            try {
                return LocalDate.parse(s);
            } catch (DateTimeParseException e) {
                throw error(n, key, "not a date").value(s).fix("write the date as YYYY-MM-DD").build();
            }
        }
    }
}
