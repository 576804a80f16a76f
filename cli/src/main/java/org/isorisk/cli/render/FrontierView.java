package org.isorisk.cli.render;

import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.util.ArrayList;
import java.util.List;
import org.isorisk.cli.json.ResultJson;
import org.isorisk.engine.explain.Explain;
import org.isorisk.engine.io.LoadedUniverse;
import org.isorisk.engine.model.Corner;
import org.isorisk.engine.model.Frontier;
import org.isorisk.engine.model.MertonScalars;
import org.isorisk.engine.model.Method;
import org.isorisk.engine.model.Multiplier;
import org.isorisk.engine.model.RejectedTarget;
import org.isorisk.engine.model.Solution;
import org.isorisk.notebooks.report.CsvWriter;

/**
 * A frontier for people, spreadsheets and scripts: the corner portfolios (when the method computes them), the
 * sampled points, the targets refused, and the unconstrained closed-form frontier for comparison.
 *
 * @param frontier       the engine's frontier
 * @param method         how it was computed: {@code closed-form} (no policy), {@code critical-line} (exact corners),
 *                       {@code numerical} (sampled by the QP, no corners)
 * @param policy         file name of the policy; null without one
 * @param inputs         the universe as loaded (provenance)
 * @param notes          the command's notes about the method
 * @param warnings       the loader's warnings
 * @param frontierMillis time in the engine
 */
public record FrontierView(Frontier frontier, Method method, String policy, LoadedUniverse inputs, List<String> notes,
                           List<String> warnings, double frontierMillis) implements Rendered {

    /** Points per block of the weights table, so that a block stays about a screen wide. */
    private static final int BLOCK = 7;

    public FrontierView {
        notes = List.copyOf(notes);
        warnings = List.copyOf(warnings);
    }

    /** True when the corner portfolios are exact (critical line method). */
    public boolean cornersExact() {
        return method == Method.CRITICAL_LINE;
    }

    /** The volatility of the unconstrained (closed-form) frontier at return {@code m}; NaN when not available. */
    public double unconstrainedVolatility(double m) {
        MertonScalars ms = frontier.unconstrained();
        return ms == null ? Double.NaN : ms.volatility(m);
    }

    /** The return-target shadow price of a portfolio, or null when it has no target row. */
    private static Multiplier target(Solution s) {
        return s.multiplier("target_return").orElse(null);
    }

    /** The binding constraints besides the budget and the return target. */
    public static List<String> binding(Solution s) {
        List<String> out = new ArrayList<>();
        for (Multiplier m : s.binding()) {
            if (!m.constraint().equals("budget") && !m.constraint().equals("target_return")) {
                out.add(m.constraint());
            }
        }
        return out;
    }

    // ---- JSON -------------------------------------------------------------------------------------------------

    private ObjectNode entry(ObjectNode o, Solution s) {
        Multiplier t = target(s);
        ObjectNode rm = o.putObject("return_multiplier");
        ResultJson.number(rm, "variance_per_unit", t == null ? 0 : t.variancePerUnit());
        ResultJson.number(rm, "volatility_per_unit", t == null ? 0 : t.volatilityPerUnit());
        o.set("binding", ResultJson.strings(binding(s)));
        ResultJson.number(o, "unconstrained_volatility", unconstrainedVolatility(s.expectedReturn()));
        return o;
    }

    @Override
    public ObjectNode json() {
        ObjectNode o = ResultJson.object();
        o.put("status", "optimal");
        o.put("method", method.label());
        if (policy == null) {
            o.putNull("policy");
        } else {
            o.put("policy", policy);
        }
        o.put("corners_exact", cornersExact());
        ObjectNode range = o.putObject("range");
        ResultJson.number(range, "lowest", frontier.lowestReturn());
        ResultJson.number(range, "minimum_variance", frontier.minReturn());
        ResultJson.number(range, "highest", frontier.maxReturn());
        ArrayNode corners = o.putArray("corners");
        for (Corner c : frontier.corners()) {
            corners.add(entry(ResultJson.corner(c), c.portfolio()));
        }
        ArrayNode ineff = o.putArray("inefficient_corners");
        for (Corner c : frontier.inefficientCorners()) {
            ineff.add(entry(ResultJson.corner(c), c.portfolio()));
        }
        ArrayNode points = o.putArray("points");
        for (Solution s : frontier.points()) {
            points.add(entry(ResultJson.solution(s), s));
        }
        ArrayNode rejected = o.putArray("rejected");
        frontier.rejected().forEach(r -> rejected.add(ResultJson.rejected(r)));
        MertonScalars ms = frontier.unconstrained();
        if (ms == null) {
            o.putNull("unconstrained");
        } else {
            ObjectNode u = ResultJson.merton(ms);
            u.put("description", "budget only, short positions allowed (closed form, Merton 1972)");
            ArrayNode up = u.putArray("points");
            for (Solution s : frontier.points()) {
                double m = s.expectedReturn();
                ObjectNode e = up.addObject();
                ResultJson.number(e, "expected_return", m);
                ResultJson.number(e, "variance", ms.variance(m));
                ResultJson.number(e, "volatility", ms.volatility(m));
                ResultJson.number(e, "return_multiplier", ms.returnMultiplier(m));
            }
            o.set("unconstrained", u);
        }
        o.set("notes", ResultJson.strings(notes));
        o.set("warnings", ResultJson.strings(warnings));
        o.set("inputs", ResultJson.provenance(inputs.provenance()));
        ResultJson.number(o.putObject("timing_ms"), "frontier", frontierMillis);
        return o;
    }

    // ---- table ------------------------------------------------------------------------------------------------

    /** "Efficient frontier under policy.yaml (method: critical-line)". */
    public String title() {
        return (policy == null ? "Efficient frontier, budget only (no policy file; short positions allowed)"
                : "Efficient frontier under the mandate " + policy) + " (method: " + method.label() + ")";
    }

    @Override
    public String table() {
        StringBuilder b = new StringBuilder();
        b.append(title()).append('\n');
        b.append(Sections.inputs(inputs.provenance()));
        b.append('\n').append(Text.wrap(rangeLine(), "", "  "));
        if (!frontier.corners().isEmpty()) {
            b.append('\n').append(corners("Corner portfolios (exact, critical line method), from the minimum-variance "
                    + "end to the highest return:", frontier.corners()));
        }
        if (!frontier.inefficientCorners().isEmpty()) {
            b.append('\n').append(corners("Corner portfolios of the inefficient branch, from the lowest return up to "
                    + "the minimum-variance portfolio:", frontier.inefficientCorners()));
        }
        if (!frontier.points().isEmpty()) {
            b.append('\n').append(points());
        }
        if (!frontier.rejected().isEmpty()) {
            b.append("\nTargets refused (outside what the mandate allows):\n");
            for (RejectedTarget r : frontier.rejected()) {
                b.append(Text.wrap(Text.pct(r.target()) + ": " + r.reason(), "  - ", "    "));
            }
        }
        b.append(Sections.bullets("Notes:", allNotes()));
        b.append(Sections.bullets("Warnings:", warnings));
        b.append('\n').append(Text.caution());
        return b.toString();
    }

    /**
     * The command's notes, then the solver's: a note every sampled point carries is listed once, a note only some
     * points carry (a non-unique multiplier, the inefficient branch, an end of the range) with their returns.
     */
    private List<String> allNotes() {
        List<String> out = new ArrayList<>(notes);
        List<Solution> ps = frontier.points();
        java.util.Map<String, List<String>> where = new java.util.LinkedHashMap<>();
        for (Solution s : ps) {
            for (String n : s.notes()) {
                if (n.startsWith("Exact: interpolated between") || n.startsWith("Solved by the active-set method")) {
                    continue; // says how each point was solved, with its own numbers; the method note covers it
                }
                List<String> at = where.computeIfAbsent(n, k -> new ArrayList<>());
                if (!at.contains(Text.pct(s.expectedReturn()))) {
                    at.add(Text.pct(s.expectedReturn()));
                }
            }
        }
        for (java.util.Map.Entry<String, List<String>> e : where.entrySet()) {
            boolean everywhere = e.getValue().size() == ps.size();
            out.add(everywhere ? e.getKey() : "At " + String.join(", ", e.getValue()) + ": " + e.getKey());
        }
        return out;
    }

    private String rangeLine() {
        String s = "Minimum-variance portfolio at a return of " + Text.pct(frontier.minReturn());
        if (Double.isFinite(frontier.lowestReturn()) && Double.isFinite(frontier.maxReturn())) {
            s += "; the mandate allows expected returns from " + Text.pct(frontier.lowestReturn()) + " to "
                    + Text.pct(frontier.maxReturn());
        } else {
            s += "; without bounds any expected return can be reached";
        }
        MertonScalars ms = frontier.unconstrained();
        if (ms != null) {
            s += ". Unconstrained frontier (budget only, short positions allowed, closed form): minimum variance at "
                    + Text.pct(ms.minimumVarianceReturn()) + " with volatility "
                    + Text.pct(ms.volatility(ms.minimumVarianceReturn()));
        }
        return s + ".";
    }

    private String corners(String heading, List<Corner> corners) {
        StringBuilder b = new StringBuilder(Text.wrap(heading, "", "  "));
        Text.Table t = new Text.Table("#", "Return", "Volatility", "Target price (variance)", "(volatility)", "Change",
                "Asset");
        for (int k = 0; k < corners.size(); k++) {
            Corner c = corners.get(k);
            Multiplier m = target(c.portfolio());
            t.row(Integer.toString(k + 1), Text.pct(c.expectedReturn()), Text.pct(c.portfolio().volatility()),
                    m == null ? "0" : Text.num(m.variancePerUnit()), m == null ? "0" : Text.num(m.volatilityPerUnit()),
                    c.change(), c.asset() == null ? "" : c.asset());
        }
        b.append(t.render("  "));
        for (int k = 0; k < corners.size(); k++) {
            b.append(Text.wrap(corners.get(k).description(), "  " + (k + 1) + ". ", "     "));
        }
        List<Solution> ps = corners.stream().map(Corner::portfolio).toList();
        b.append(weights(ps, "Corner"));
        return b.toString();
    }

    private String points() {
        List<Solution> ps = frontier.points();
        StringBuilder b = new StringBuilder("Sampled frontier (" + ps.size() + " point" + (ps.size() == 1 ? "" : "s")
                + "; target price = shadow price of the return target, per unit of return):\n");
        Text.Table t = new Text.Table("Return", "Volatility", "Unconstrained volatility", "Target price (variance)",
                "(volatility)", "Binding");
        for (Solution s : ps) {
            Multiplier m = target(s);
            t.row(Text.pct(s.expectedReturn()), Text.pct(s.volatility()),
                    Text.pct(unconstrainedVolatility(s.expectedReturn())),
                    m == null ? "0" : Text.num(m.variancePerUnit()), m == null ? "0" : Text.num(m.volatilityPerUnit()),
                    Integer.toString(binding(s).size()));
        }
        b.append(t.render("  "));
        b.append("  Binding constraints at each point (besides the budget and the return target):\n");
        for (Solution s : ps) {
            List<String> names = binding(s);
            b.append(Text.wrap(Text.pct(s.expectedReturn()) + ": " + (names.isEmpty() ? "none" : String.join(", ",
                    names)), "  - ", "    "));
        }
        b.append(weights(ps, "Return"));
        return b.toString();
    }

    /** Weights with one column per portfolio, in blocks of {@value #BLOCK} columns. */
    private static String weights(List<Solution> ps, String label) {
        StringBuilder b = new StringBuilder("  Weights:\n");
        List<String> assets = ps.get(0).assets();
        for (int from = 0; from < ps.size(); from += BLOCK) {
            int to = Math.min(ps.size(), from + BLOCK);
            String[] head = new String[to - from + 1];
            head[0] = label.equals("Corner") ? "Asset / corner" : "Asset / return";
            for (int k = from; k < to; k++) {
                head[k - from + 1] = label.equals("Corner") ? Integer.toString(k + 1) : Text.pct(ps.get(k)
                        .expectedReturn());
            }
            Text.Table t = new Text.Table(head);
            for (int i = 0; i < assets.size(); i++) {
                String[] row = new String[to - from + 1];
                row[0] = assets.get(i);
                for (int k = from; k < to; k++) {
                    row[k - from + 1] = Text.pct(ps.get(k).weight(i));
                }
                t.row(row);
            }
            b.append(t.render("  "));
        }
        return b.toString();
    }

    // ---- CSV --------------------------------------------------------------------------------------------------

    @Override
    public String csv() {
        return CsvWriter.text(c -> {
            Sections.csvHeader(c, "frontier", inputs.provenance(), warnings);
            c.comment("method", method.label());
            c.comment("policy", policy == null ? "none (budget only; short positions allowed)" : policy);
            c.comment("corners_exact", Boolean.toString(cornersExact()));
            c.comment("minimum_variance_return", CsvWriter.number(frontier.minReturn()));
            c.comment("lowest_return", CsvWriter.number(frontier.lowestReturn()));
            c.comment("highest_return", CsvWriter.number(frontier.maxReturn()));
            for (RejectedTarget r : frontier.rejected()) {
                c.comment("rejected", CsvWriter.number(r.target()) + ": " + r.reason());
            }
            for (String n : notes) {
                c.comment("note", n);
            }
            List<Object> head = new ArrayList<>(List.of("kind", "expected_return", "volatility", "variance",
                    "return_multiplier_variance", "return_multiplier_volatility", "unconstrained_volatility", "change",
                    "binding"));
            List<String> assets = inputs.assets();
            head.addAll(assets);
            c.row(head.toArray());
            for (Corner k : frontier.inefficientCorners()) {
                c.row(row("inefficient-corner", k.portfolio(), k.change()).toArray());
            }
            for (Corner k : frontier.corners()) {
                c.row(row("corner", k.portfolio(), k.change()).toArray());
            }
            for (Solution s : frontier.points()) {
                c.row(row("point", s, null).toArray());
            }
        });
    }

    private List<Object> row(String kind, Solution s, String change) {
        Multiplier m = target(s);
        List<Object> r = new ArrayList<>(List.of(kind, s.expectedReturn(), s.volatility(), s.variance(),
                m == null ? 0.0 : m.variancePerUnit(), m == null ? 0.0 : m.volatilityPerUnit(),
                unconstrainedVolatility(s.expectedReturn())));
        r.add(change);
        r.add(String.join("; ", binding(s)));
        for (int i = 0; i < s.assets().size(); i++) {
            r.add(s.weight(i));
        }
        return r;
    }

    /** A one-line reading of a point's return-target price, e.g. for the demo. */
    public static String targetSentence(Solution s) {
        Multiplier m = target(s);
        return m == null ? "" : Explain.sentence(m);
    }
}
