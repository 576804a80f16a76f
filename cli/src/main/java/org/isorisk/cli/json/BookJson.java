package org.isorisk.cli.json;

import com.fasterxml.jackson.databind.node.ObjectNode;
import java.util.List;
import java.util.Locale;
import org.isorisk.engine.book.BookTables;
import org.isorisk.engine.book.Job;
import org.isorisk.engine.book.PortfolioResult;
import org.isorisk.engine.error.IsoriskException;
import org.isorisk.engine.error.NoSolutionException;
import org.isorisk.engine.model.Solution;
import org.isorisk.engine.rebalance.RebalanceResult;
import org.isorisk.engine.stress.StressResult;

/**
 * The JSON object of one portfolio of a book ({@code portfolios.jsonl}): the single command's shape for what the
 * engine returned ({@link ResultJson#solution}, {@link RebalanceStressJson#rebalance} or
 * {@link RebalanceStressJson#stress}; for a failure {@code status}, {@code error} and, when there is no solution,
 * {@code reason}, {@code constraints} and {@code range}), led by the row's {@code row}, {@code id},
 * {@code assumptions}, {@code policy} and {@code job}, and closed by {@code timing_ms} and {@code caution}. One line,
 * rendered on the thread that ran the row.
 */
public final class BookJson {
    private BookJson() {
    }

    private static final int ASSUMPTIONS = BookTables.RESULTS.index("assumptions");
    private static final int POLICY = BookTables.RESULTS.index("policy");
    private static final int WARNINGS = BookTables.RESULTS.index("warnings");

    /** {@code r} with its JSON line (the job must have been asked to keep what the engine returned). */
    public static PortfolioResult withJson(PortfolioResult r, Job job) {
        return r.withJson(object(r, job).toString()); // compact: one object per line
    }

    /** The object of one portfolio. */
    public static ObjectNode object(PortfolioResult r, Job job) {
        ObjectNode o = ResultJson.object();
        o.put("row", r.row());
        o.put("id", r.id());
        Object set = r.values()[ASSUMPTIONS];
        o.put("assumptions", set == null ? "" : (String) set);
        if (r.values()[POLICY] != null) {
            o.put("policy", (String) r.values()[POLICY]);
        }
        o.put("job", job.label());
        Object d = r.detail();
        ObjectNode shape = d instanceof Solution s ? ResultJson.solution(s)
                : d instanceof RebalanceResult rr ? RebalanceStressJson.rebalance(rr)
                : d instanceof StressResult sr ? RebalanceStressJson.stress(sr) : failure(r);
        shape.fields().forEachRemaining(e -> {
            if (!o.has(e.getKey())) {
                o.set(e.getKey(), e.getValue());
            }
        });
        o.put("status", r.status().label());
        if (!r.message().isEmpty()) {
            o.put("error", r.message());
        }
        if (r.values()[WARNINGS] != null) {
            o.set("warnings", ResultJson.strings(List.of(((String) r.values()[WARNINGS]).split(" \\| "))));
        }
        return ResultJson.finish(o, r.millis());
    }

    private static ObjectNode failure(PortfolioResult r) {
        ObjectNode o = ResultJson.object();
        o.put("status", r.status().label());
        o.put("error", r.message());
        if (r.detail() instanceof NoSolutionException e) {
            o.put("reason", e.reason().name().toLowerCase(Locale.ROOT).replace('_', '-'));
            o.set("constraints", ResultJson.strings(e.constraints()));
            e.achievableReturns().ifPresent(range -> {
                ObjectNode x = o.putObject("range");
                ResultJson.number(x, "min", range[0]);
                ResultJson.number(x, "max", range[1]);
            });
        } else if (r.detail() instanceof IsoriskException) {
            o.put("reason", "invalid-input");
        }
        return o;
    }
}
