package org.isorisk.cli.json;

import com.fasterxml.jackson.core.JsonFactory;
import com.fasterxml.jackson.core.JsonGenerator;
import com.fasterxml.jackson.core.util.DefaultIndenter;
import com.fasterxml.jackson.core.util.DefaultPrettyPrinter;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.JsonNodeFactory;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.IOException;
import java.io.Writer;
import java.util.Iterator;
import java.util.List;
import java.util.Map;
import org.isorisk.engine.explain.Caution;
import org.isorisk.engine.explain.Explain;
import org.isorisk.engine.io.Provenance;
import org.isorisk.engine.io.SourceFile;
import org.isorisk.engine.model.Certificate;
import org.isorisk.engine.model.Corner;
import org.isorisk.engine.model.MertonScalars;
import org.isorisk.engine.model.Multiplier;
import org.isorisk.engine.model.RejectedTarget;
import org.isorisk.engine.model.Solution;
import org.isorisk.engine.risk.AssumptionSummary;
import org.isorisk.engine.risk.Contribution;
import org.isorisk.engine.risk.RiskDecomposition;
import org.isorisk.engine.risk.TrackingError;

/**
 * The JSON shapes of results, one per kind of value, shared by every command and export (field names in
 * {@code snake_case}, numbers in decimals; a number that is not finite is written as {@code null}).
 * The solution shape is the machine-readable contract of the design: {@code status}, {@code method},
 * {@code weights}, {@code expected_return}, {@code variance}, {@code volatility}, {@code multipliers},
 * {@code certificate}, {@code notes}; {@link #finish} adds {@code timing_ms} and {@code caution}.
 */
public final class ResultJson {
    private ResultJson() {
    }

    private static final JsonNodeFactory NODES = JsonNodeFactory.instance;

    /** A new empty object. */
    public static ObjectNode object() {
        return NODES.objectNode();
    }

    /** A new empty array. */
    public static ArrayNode array() {
        return NODES.arrayNode();
    }

    /** Sets a number, or null when it is not finite (JSON has no NaN or infinity). */
    public static ObjectNode number(ObjectNode o, String field, double v) {
        if (Double.isFinite(v)) {
            o.put(field, v);
        } else {
            o.putNull(field);
        }
        return o;
    }

    /** A solution in the contract's shape, {@code status} first. */
    public static ObjectNode solution(Solution s) {
        ObjectNode o = object();
        o.put("status", s.status().label());
        o.put("method", s.method().label());
        ObjectNode w = o.putObject("weights");
        for (int i = 0; i < s.assets().size(); i++) {
            number(w, s.assets().get(i), s.weight(i));
        }
        number(o, "expected_return", s.expectedReturn());
        number(o, "variance", s.variance());
        number(o, "volatility", s.volatility());
        ArrayNode ms = o.putArray("multipliers");
        for (Multiplier m : s.multipliers()) {
            ObjectNode e = ms.addObject();
            e.put("constraint", m.constraint());
            number(e, "variance_per_unit", m.variancePerUnit());
            number(e, "volatility_per_unit", m.volatilityPerUnit());
            e.put("binding", m.binding());
            e.put("sentence", Explain.sentence(m));
        }
        o.set("certificate", certificate(s.certificate()));
        ArrayNode notes = o.putArray("notes");
        s.notes().forEach(notes::add);
        return o;
    }

    /**
     * A corner portfolio: the solution's shape plus {@code change} ({@code enters}, {@code leaves}, ...),
     * {@code asset} (null at an end where nothing changes), {@code description} and {@code free} (the free set on
     * the stretch towards the minimum-variance portfolio).
     */
    public static ObjectNode corner(Corner c) {
        ObjectNode o = solution(c.portfolio());
        o.put("change", c.change());
        if (c.asset() == null) {
            o.putNull("asset");
        } else {
            o.put("asset", c.asset());
        }
        o.put("description", c.description());
        o.set("free", strings(c.free()));
        return o;
    }

    /** A frontier target the mandate cannot reach: {@code target} and {@code reason}. */
    public static ObjectNode rejected(RejectedTarget r) {
        ObjectNode o = object();
        number(o, "target", r.target());
        o.put("reason", r.reason());
        return o;
    }

    /** Merton's (1972) scalars of the closed-form frontier with its minimum-variance point. */
    public static ObjectNode merton(MertonScalars m) {
        ObjectNode o = object();
        number(o, "a", m.a());
        number(o, "b", m.b());
        number(o, "c", m.c());
        number(o, "d", m.d());
        number(o, "budget", m.budget());
        number(o, "minimum_variance_return", m.minimumVarianceReturn());
        number(o, "minimum_variance", m.minimumVariance());
        number(o, "minimum_volatility", m.volatility(m.minimumVarianceReturn()));
        return o;
    }

    /** The certificate: residuals, condition number, the method's threshold and whether it passes. */
    public static ObjectNode certificate(Certificate c) {
        ObjectNode o = object();
        number(o, "stationarity", c.stationarity());
        number(o, "primal", c.primal());
        number(o, "dual", c.dual());
        number(o, "complementarity", c.complementarity());
        number(o, "condition_number", c.conditionNumber());
        number(o, "threshold", c.threshold());
        o.put("convex", c.convex());
        o.put("passes", c.passes());
        return o;
    }

    /** Input files and as-of date. */
    public static ObjectNode provenance(Provenance p) {
        ObjectNode o = object();
        ArrayNode files = o.putArray("files");
        for (SourceFile f : p.inputs()) {
            ObjectNode e = files.addObject();
            e.put("role", f.role());
            e.put("name", f.name());
            e.put("sha256", f.sha256());
            e.put("bytes", f.bytes());
        }
        if (p.asOf() == null) {
            o.putNull("as_of");
        } else {
            o.put("as_of", p.asOf().toString());
        }
        o.put("as_of_source", p.asOfSource());
        if (p.scenario() != null) {
            o.put("scenario", p.scenario());
        }
        return o;
    }

    /** A risk decomposition; {@code withReturn} false leaves out the expected return (no returns file given). */
    public static ObjectNode decomposition(RiskDecomposition d, boolean withReturn) {
        ObjectNode o = object();
        if (withReturn) {
            number(o, "expected_return", d.expectedReturn());
        }
        number(o, "variance", d.variance());
        number(o, "volatility", d.volatility());
        number(o, "total_weight", d.totalWeight());
        number(o, "euler_residual", d.eulerResidual());
        o.set("contributions", contributions(d, "weight"));
        return o;
    }

    /** Tracking error and the decomposition of active risk. */
    public static ObjectNode trackingError(TrackingError t) {
        ObjectNode o = object();
        number(o, "value", t.value());
        if (t.active() != null) {
            number(o, "euler_residual", t.active().eulerResidual());
            o.set("contributions", contributions(t.active(), "active_weight"));
        } else {
            o.putArray("contributions");
        }
        return o;
    }

    private static ArrayNode contributions(RiskDecomposition d, String weightName) {
        ArrayNode a = array();
        for (Contribution c : d.contributions()) {
            ObjectNode e = a.addObject();
            e.put("asset", c.asset());
            number(e, weightName, c.weight());
            number(e, "marginal", c.marginal());
            number(e, "component", c.component());
            number(e, "share", c.share());
        }
        return a;
    }

    /** The assumptions' summary (check). */
    public static ObjectNode summary(AssumptionSummary s) {
        ObjectNode o = object();
        o.put("assets", s.assets());
        ObjectNode v = o.putObject("volatility");
        v.set("lowest", extreme(s.lowestVolatility()));
        v.set("highest", extreme(s.highestVolatility()));
        ObjectNode r = o.putObject("expected_return");
        r.set("lowest", extreme(s.lowestReturn()));
        r.set("highest", extreme(s.highestReturn()));
        number(o, "smallest_eigenvalue", s.smallestEigenvalue());
        number(o, "largest_eigenvalue", s.largestEigenvalue());
        number(o, "condition_number", s.conditionNumber());
        o.put("eigenvalues_exact", s.exact());
        ArrayNode per = o.putArray("per_asset");
        for (int i = 0; i < s.names().size(); i++) {
            ObjectNode e = per.addObject();
            e.put("asset", s.names().get(i));
            number(e, "expected_return", s.expectedReturns()[i]);
            number(e, "volatility", s.volatilities()[i]);
        }
        return o;
    }

    private static ObjectNode extreme(AssumptionSummary.Extreme e) {
        ObjectNode o = object();
        o.put("asset", e.asset());
        number(o, "value", e.value());
        return o;
    }

    /** A list of strings as an array. */
    public static ArrayNode strings(List<String> items) {
        ArrayNode a = array();
        items.forEach(a::add);
        return a;
    }

    /**
     * Completes a top-level result: adds {@code timing_ms.total} (merged into an existing {@code timing_ms})
     * and the {@code caution}, which every JSON result carries.
     */
    public static ObjectNode finish(ObjectNode o, double totalMillis) {
        ObjectNode t = o.has("timing_ms") ? (ObjectNode) o.get("timing_ms") : o.putObject("timing_ms");
        number(t, "total", totalMillis);
        o.put("caution", Caution.TEXT);
        return o;
    }

    /** The text {@link #write} writes, for printing to a terminal the same bytes as to a file. */
    public static String text(JsonNode node) {
        java.io.StringWriter w = new java.io.StringWriter();
        try {
            write(node, w);
        } catch (IOException e) {
            throw new IllegalStateException("a StringWriter does not fail", e);
        }
        return w.toString();
    }

    /** Writes {@code node} pretty-printed with a final line break; the writer is flushed, not closed. */
    public static void write(JsonNode node, Writer out) throws IOException {
        JsonGenerator g = new JsonFactory().createGenerator(out);
        g.setPrettyPrinter(new DefaultPrettyPrinter().withObjectIndenter(new DefaultIndenter("  ", "\n")));
        g.disable(JsonGenerator.Feature.AUTO_CLOSE_TARGET);
        writeNode(g, node);
        g.flush();
        out.write("\n");
        out.flush();
    }

    /** The tree walked with the streaming generator, so that printing needs no object mapper (fast start-up). */
    private static void writeNode(JsonGenerator g, JsonNode n) throws IOException {
        if (n.isObject()) {
            g.writeStartObject();
            Iterator<Map.Entry<String, JsonNode>> it = n.fields();
            while (it.hasNext()) {
                Map.Entry<String, JsonNode> e = it.next();
                g.writeFieldName(e.getKey());
                writeNode(g, e.getValue());
            }
            g.writeEndObject();
        } else if (n.isArray()) {
            g.writeStartArray();
            for (JsonNode c : n) {
                writeNode(g, c);
            }
            g.writeEndArray();
        } else if (n.isTextual()) {
            g.writeString(n.textValue());
        } else if (n.isBoolean()) {
            g.writeBoolean(n.booleanValue());
        } else if (n.isNull()) {
            g.writeNull();
        } else if (n.isIntegralNumber()) {
            g.writeNumber(n.longValue());
        } else if (n.isNumber()) {
            g.writeNumber(n.doubleValue());
        } else {
            throw new IllegalArgumentException("unexpected JSON node " + n.getNodeType());
        }
    }
}
