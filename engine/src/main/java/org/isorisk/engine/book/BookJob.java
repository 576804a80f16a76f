package org.isorisk.engine.book;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.OptionalDouble;
import java.util.Set;
import java.util.TreeSet;
import java.util.concurrent.ConcurrentHashMap;
import java.util.function.Function;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.error.IsoriskException;
import org.isorisk.engine.error.NoSolutionException;
import org.isorisk.engine.explain.Explain;
import org.isorisk.engine.book.CsvCells;
import org.isorisk.engine.io.InputFile;
import org.isorisk.engine.io.Names;
import org.isorisk.engine.io.NumberText;
import org.isorisk.engine.io.PolicyReader;
import org.isorisk.engine.io.PortfolioFile;
import org.isorisk.engine.io.PortfolioReader;
import org.isorisk.engine.io.ScenarioFile;
import org.isorisk.engine.io.UniverseLoader;
import org.isorisk.engine.linalg.Workers;
import org.isorisk.engine.model.AllocationRequest;
import org.isorisk.engine.model.AssetUniverse;
import org.isorisk.engine.model.Certificate;
import org.isorisk.engine.model.Group;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.Method;
import org.isorisk.engine.model.Multiplier;
import org.isorisk.engine.model.Objective;
import org.isorisk.engine.model.Policy;
import org.isorisk.engine.model.Solution;
import org.isorisk.engine.model.SolverSettings;
import org.isorisk.engine.model.Status;
import org.isorisk.engine.rebalance.Holdings;
import org.isorisk.engine.rebalance.RebalanceObjective;
import org.isorisk.engine.rebalance.RebalanceRequest;
import org.isorisk.engine.rebalance.RebalanceResult;
import org.isorisk.engine.rebalance.Rebalancer;
import org.isorisk.engine.rebalance.Trade;
import org.isorisk.engine.rebalance.TradingLimits;
import org.isorisk.engine.solve.Allocator;
import org.isorisk.engine.stress.CorrelationRepair;
import org.isorisk.engine.stress.Scenario;
import org.isorisk.engine.stress.ScenarioPoint;
import org.isorisk.engine.stress.ScenarioResult;
import org.isorisk.engine.stress.Stress;
import org.isorisk.engine.stress.StressRequest;
import org.isorisk.engine.stress.StressResult;
import org.isorisk.engine.stress.TargetPoint;

/**
 * The job of one book row, shared by every engine: the row's assumption set, policy (with the row's overrides),
 * target and holdings, then the engine's own front door exactly as the single command calls it —
 * {@link Allocator} for {@code solve} (on the set's covariance factored once: bit for bit the single command's
 * answer), {@link Rebalancer} for {@code rebalance}, {@link Stress} for {@code stress} — on the calling thread alone
 * (one-thread settings, {@link Workers#onCallingThread}), since a book runs its rows in parallel. Whatever goes
 * wrong with a row becomes its result: bad input ({@code invalid-input}), no solution ({@code infeasible}), a
 * numerical failure or a bug ({@code not-solved}), each with the single command's one-line message. Files that many
 * rows share (policies, holdings, scenarios) are read once per assumption set. Thread-safe.
 */
public final class BookJob implements Function<BookRow, PortfolioResult> {

    /** Most policies (holdings files, scenario lists) kept read; past it the memory starts afresh. */
    static final int CACHE_LIMIT = 4096;

    /** Prefix of the message of a failure that is a bug. */
    public static final String BUG = "internal error (a bug; please report it): ";

    private static final BookTables.Table R = BookTables.RESULTS;
    private static final int ROW = R.index("row");
    private static final int ID = R.index("id");
    private static final int STATUS = R.index("status");
    private static final int MESSAGE = R.index("message");
    private static final int SET = R.index("assumptions");
    private static final int POLICY = R.index("policy");
    private static final int METHOD = R.index("method");
    private static final int OBJECTIVE = R.index("objective");
    private static final int TARGET = R.index("target_return");
    private static final int RETURN = R.index("expected_return");
    private static final int NET = R.index("net_return");
    private static final int VOLATILITY = R.index("volatility");
    private static final int VARIANCE = R.index("variance");
    private static final int TURNOVER = R.index("turnover");
    private static final int TRADES = R.index("trades");
    private static final int COST = R.index("cost");
    private static final int TE = R.index("tracking_error");
    private static final int TARGET_V = R.index("target_variance_per_unit");
    private static final int TARGET_S = R.index("target_volatility_per_unit");
    private static final int TURNOVER_V = R.index("turnover_variance_per_unit");
    private static final int BINDING = R.index("binding");
    private static final int STATIONARITY = R.index("stationarity");
    private static final int PRIMAL = R.index("primal");
    private static final int DUAL = R.index("dual");
    private static final int COMPLEMENTARITY = R.index("complementarity");
    private static final int CONDITION = R.index("condition_number");
    private static final int CERTIFIED = R.index("certified");
    private static final int WARNINGS = R.index("warnings");

    private final BookSpec spec;
    private final BookColumns columns;
    private final InputFile book;
    private final AssumptionSets sets;
    private final InputFile sharedPolicy;
    private final InputFile scenarios;
    private final boolean keepValues;
    private final SolverSettings settings = SolverSettings.defaults().withThreads(1);
    private final Map<String, Object> policies = new ConcurrentHashMap<>();
    private final Map<String, Object> holdingFiles = new ConcurrentHashMap<>();
    private final Map<String, Object> scenarioLists = new ConcurrentHashMap<>();
    /** Each set's asset names as CSV text cells, rendered once (every weights row repeats them). */
    private final Map<String, String[]> assetCells = new ConcurrentHashMap<>();

    private BookJob(BookSpec spec, BookColumns columns, InputFile book, AssumptionSets sets, InputFile sharedPolicy,
                    InputFile scenarios, boolean keepValues) {
        this.spec = spec;
        this.columns = columns;
        this.book = book;
        this.sets = sets;
        this.sharedPolicy = sharedPolicy;
        this.scenarios = scenarios;
        this.keepValues = keepValues;
    }

    /**
     * The job of a run. The run's own assumptions, its shared policy and its scenario file are read here, so that a
     * problem with them stops the run before any work (the single command would stop too); a named set, a row's
     * policy or holdings are read when a row first needs them, and their problems fail only those rows.
     *
     * @param columns    the book's columns ({@link Book#columns()})
     * @param files      opens a path of the spec (a local path, a Hadoop file system path)
     * @param keepValues true to keep the weights and extra rows as values too (a Parquet writer), not only as text
     * @throws InputException when the run's own assumptions, the sets file, the shared policy or the scenario file
     *                        cannot be used
     */
    public static BookJob open(BookSpec spec, BookColumns columns, Function<String, InputFile> files,
                               boolean keepValues) {
        InputFile book = files.apply(spec.book());
        InputFile[] own = {open(files, spec.expectedReturns()), open(files, spec.covariance()),
                open(files, spec.volatilities()), open(files, spec.correlation())};
        SolverSettings one = SolverSettings.defaults().withThreads(1);
        AssumptionSets sets = AssumptionSets.of(own, open(files, spec.assumptionSets()), spec.units(), one);
        BookJob job = new BookJob(spec, columns, book, sets, open(files, spec.policy()), open(files, spec.scenarios()),
                keepValues);
        if (sets.has(AssumptionSets.OWN)) {
            AssumptionSets.AssumptionSet base = sets.get(AssumptionSets.OWN);
            Policy p = null;
            if (job.sharedPolicy != null) {
                p = job.policy(job.sharedPolicy, base);
            }
            if (job.scenarios != null && spec.job() == Job.STRESS) {
                job.scenarios(job.sharedPolicy, p, base);
            }
        }
        return job;
    }

    private static InputFile open(Function<String, InputFile> files, String path) {
        return path == null ? null : files.apply(path);
    }

    /** The warnings of the run's own assumptions and of every set read so far. */
    public List<String> warnings() {
        List<String> out = new ArrayList<>();
        if (sets.has(AssumptionSets.OWN)) {
            try {
                out.addAll(sets.get(AssumptionSets.OWN).loaded().warnings());
            } catch (IsoriskException e) {
                // reported with the rows
            }
        }
        return out;
    }

    /** The run's own assumption set, when it has one (its provenance and warnings for the run's record). */
    public java.util.Optional<AssumptionSets.AssumptionSet> own() {
        return sets.has(AssumptionSets.OWN) ? java.util.Optional.of(sets.get(AssumptionSets.OWN))
                : java.util.Optional.empty();
    }

    /** Runs the row on the calling thread alone; never throws for a problem of the row. */
    @Override
    public PortfolioResult apply(BookRow row) {
        return Workers.onCallingThread(() -> run(row));
    }

    // ------------------------------------------------------------------ one row

    /** What is known about a row as it is worked out (for the failure's result too). */
    private final class Work {
        final BookRow row;
        final String id;
        final Object[] v = new Object[R.columns().size()];
        final List<String> warnings = new ArrayList<>();
        final long started = System.nanoTime();
        String setName = "";
        String policyLabel;
        AssumptionSets.AssumptionSet set;
        Policy policy;
        InputFile policyFile;

        Work(BookRow row) {
            this.row = row;
            this.id = row.cell(columns.id);
            v[ROW] = (long) row.row();
            v[ID] = id;
        }

        InputException.Builder error(int column, String problem) {
            InputException.Builder b = InputException.of(problem).file(book.path()).row(row.row());
            if (column >= 0) {
                b.column(columns.header().get(column));
            }
            return b;
        }

        InputException.Builder error(String header, String problem) {
            return InputException.of(problem).file(book.path()).row(row.row()).column(header);
        }
    }

    private PortfolioResult run(BookRow row) {
        Work w = new Work(row);
        try {
            return switch (spec.job()) {
                case SOLVE -> solve(w);
                case REBALANCE -> rebalance(w);
                case STRESS -> stress(w);
            };
        } catch (InputException e) {
            return failed(w, Status.INVALID_INPUT, e.getMessage(), e);
        } catch (NoSolutionException e) {
            return failed(w, e.reason() == NoSolutionException.Reason.NOT_CONVERGED ? Status.NOT_SOLVED
                    : Status.INFEASIBLE, e.getMessage(), e);
        } catch (IsoriskException e) {
            return failed(w, Status.INVALID_INPUT, e.getMessage(), e);
        } catch (RuntimeException e) {
            return failed(w, Status.NOT_SOLVED, BUG + e, null);
        }
    }

    /** The row's set, policy (with its overrides) and everything every job needs first. */
    private Mandate common(Work w) {
        BookRow row = w.row;
        if (w.id.isEmpty()) {
            throw w.error(columns.id, "the id is blank").fix("give every portfolio an id").build();
        }
        if (row.duplicateOf() > 0) {
            throw w.error(columns.id, "the id is also the id of row " + row.duplicateOf()).value(w.id)
                    .fix("give every portfolio its own id").build();
        }
        w.setName = row.cell(columns.assumptions);
        w.v[SET] = w.setName;
        if (!sets.has(w.setName)) {
            if (w.setName.isEmpty()) {
                throw w.error(columns.assumptions, "the row names no assumption set and the run has no assumption "
                        + "files of its own").fix("name a set in column assumptions (" + String.join(", ",
                        sets.names()) + "), or give --expected-returns and --covariance").build();
            }
            InputException.Builder b = w.error(columns.assumptions, "no assumption set named '" + w.setName + "'")
                    .value(w.setName);
            String near = BookColumns.nearest(w.setName, sets.names());
            throw b.fix(sets.names().isEmpty()
                    ? "give --assumption-sets FILE naming it, or leave the cell blank for the run's own files"
                    : near != null ? "did you mean '" + near + "'? The sets are: " + String.join(", ", sets.names())
                    : "use one of: " + String.join(", ", sets.names())).build();
        }
        w.set = sets.get(w.setName);
        String cell = row.cell(columns.policy);
        InputFile file;
        if (cell.isEmpty()) {
            if (sharedPolicy == null) {
                throw w.error(columns.policy, "the row names no policy and the run has no shared policy")
                        .fix("give the policy file's path (relative to the book file), or --policy FILE for every "
                                + "row without one").build();
            }
            file = sharedPolicy;
            w.policyLabel = sharedPolicy.name();
        } else {
            file = book.resolve(cell);
            w.policyLabel = cell;
        }
        w.v[POLICY] = w.policyLabel;
        Policy p = policy(file, w.set);
        w.policy = p;
        w.policyFile = file;
        return overrides(w, p);
    }

    /** The policy of {@code file} read against the set's assets, once per file and set. */
    private Policy policy(InputFile file, AssumptionSets.AssumptionSet set) {
        Object o = cached(policies, file.path() + "\u0000" + set.name(), () -> PolicyReader.read(file,
                set.loaded().assets()));
        return (Policy) o;
    }

    /** The value computed once per key (or the error it gave, rethrown to every row that needs it). */
    private static Object cached(Map<String, Object> cache, String key, java.util.function.Supplier<Object> make) {
        Object o = cache.get(key);
        if (o == null) {
            try {
                o = make.get();
            } catch (IsoriskException e) {
                o = e;
            }
            if (cache.size() >= CACHE_LIMIT) {
                cache.clear();
            }
            cache.put(key, o);
        }
        if (o instanceof IsoriskException e) {
            throw e;
        }
        return o;
    }

    /** The policy's mandate with the row's exclusions, bounds and group limits. */
    private Mandate overrides(Work w, Policy p) {
        BookRow row = w.row;
        Mandate m = p.mandate();
        List<String> assets = w.set.loaded().assets();
        double[] lo = m.lower();
        double[] hi = m.upper();
        boolean changed = false;
        Set<Integer> excluded = new TreeSet<>();
        String ex = row.cell(columns.exclude);
        if (!ex.isEmpty()) {
            for (String part : ex.split(";")) {
                String name = part.strip();
                if (name.isEmpty()) {
                    continue;
                }
                int i = assets.indexOf(name);
                if (i < 0) {
                    throw unknownAsset(w, columns.header().get(columns.exclude), name, assets);
                }
                Double fixed = m.fixed().get(i);
                if (fixed != null && fixed != 0) {
                    throw w.error(columns.exclude, "the policy fixes the weight of an excluded asset at "
                            + Explain.percent(fixed)).asset(name).value(ex)
                            .fix("drop it from exclude, or from the policy's fixed weights").build();
                }
                excluded.add(i);
                lo[i] = 0;
                hi[i] = 0;
                changed = true;
            }
        }
        for (BookColumns.Named c : columns.bounds) {
            String text = row.cell(c.column());
            if (text.isEmpty()) {
                continue;
            }
            int i = assets.indexOf(c.name());
            if (i < 0) {
                throw unknownAsset(w, c.header(), c.name(), assets);
            }
            if (excluded.contains(i)) {
                throw w.error(c.header(), "the asset is excluded and bounded in the same row").asset(c.name())
                        .value(text).fix("clear one of the two").build();
            }
            double x = rate(w, c.column(), text);
            if (c.prefix().equals("min:")) {
                lo[i] = x;
            } else {
                hi[i] = x;
            }
            if (lo[i] > hi[i]) {
                throw w.error(c.header(), "the asset's min " + Explain.percent(lo[i]) + " is above its max "
                        + Explain.percent(hi[i])).asset(c.name()).value(text).fix("make min at most max").build();
            }
            changed = true;
        }
        List<Group> groups = m.groups();
        for (BookColumns.Named c : columns.groupLimits) {
            String text = row.cell(c.column());
            if (text.isEmpty()) {
                continue;
            }
            int at = -1;
            for (int k = 0; k < groups.size(); k++) {
                if (groups.get(k).name().equals(c.name())) {
                    at = k;
                }
            }
            if (at < 0) {
                List<String> names = groups.stream().map(Group::name).toList();
                InputException.Builder b = w.error(c.header(), "the policy (" + w.policyFile.path()
                        + ") has no group '" + c.name() + "' to override").value(text);
                throw Names.hint(b, c.name(), names, names.isEmpty() ? "the policy has no groups; remove the column"
                        : "use one of its groups: " + String.join(", ", names)).build();
            }
            Group g = groups.get(at);
            double x = rate(w, c.column(), text);
            double min = c.prefix().equals("group_min:") ? x : g.min();
            double max = c.prefix().equals("group_max:") ? x : g.max();
            if (min > max) {
                throw w.error(c.header(), "the group's min " + Explain.percent(min) + " is above its max "
                        + Explain.percent(max)).value(text).fix("make min at most max").build();
            }
            groups = new ArrayList<>(groups);
            groups.set(at, new Group(g.name(), g.members(), min, max));
            changed = true;
        }
        return changed ? new Mandate(m.budget(), lo, hi, m.fixed(), groups, m.constraints()) : m;
    }

    private InputException unknownAsset(Work w, String header, String name, List<String> assets) {
        InputException.Builder b = w.error(header, "the asset is not in the assumption set"
                + (w.setName.isEmpty() ? "" : " '" + w.setName + "'")).asset(name);
        return Names.hint(b, name, assets, "use the names of the expected-returns file").build();
    }

    /** A rate (decimal, or percent under --units percent) in a cell. */
    private double rate(Work w, int column, String text) {
        double fast = NumberText.fastOrNaN(text);
        if (!Double.isNaN(fast)) {
            return spec.units().rate(fast);
        }
        NumberText.Problem problem = NumberText.problem(text);
        if (problem != null) {
            throw w.error(column, problem.problem()).value(text).fix(problem.fix()).build();
        }
        return spec.units().rate(NumberText.parse(text));
    }

    /** The row's target: its cell, else the policy's target_return; empty when neither gives one. */
    private OptionalDouble target(Work w, Policy p) {
        String t = w.row.cell(columns.target);
        if (!t.isEmpty()) {
            double m = rate(w, columns.target, t);
            if (Math.abs(m) > 1) {
                w.warnings.add("target_return " + t + " means " + Explain.percent(m)
                        + " a year; if you meant percent, add --units percent");
            }
            return OptionalDouble.of(m);
        }
        return p.targetReturn();
    }

    // ------------------------------------------------------------------ solve

    private PortfolioResult solve(Work w) {
        Mandate mandate = common(w);
        AssetUniverse u = w.set.loaded().universe();
        String kind = w.row.cell(columns.objective).toLowerCase(Locale.ROOT);
        OptionalDouble target = target(w, w.policy);
        Objective objective;
        switch (kind) {
            case "", "target" -> objective = target.isPresent() ? Objective.targetReturn(target.getAsDouble())
                    : Objective.minimumVariance();
            case "min-variance" -> {
                if (!w.row.cell(columns.target).isEmpty()) {
                    throw w.error(columns.objective, "objective min-variance takes no return target, but the row "
                            + "gives one").value(w.row.cell(columns.target))
                            .fix("clear target_return, or the objective").build();
                }
                objective = Objective.minimumVariance();
            }
            default -> throw w.error(columns.objective, "the solve job knows the objectives target and "
                    + "min-variance").value(kind).fix("write target, min-variance or nothing").build();
        }
        double[] today = holdingsWeights(w, u, false);
        w.v[OBJECTIVE] = objective instanceof Objective.TargetReturn ? "target" : "min-variance";
        Solution s = Allocator.solveWith(w.set.prepared(), new AllocationRequest(u, mandate, objective, Method.AUTO,
                settings));
        solutionValues(w, s);
        if (objective instanceof Objective.TargetReturn t) {
            w.v[TARGET] = t.target();
        }
        if (today != null) {
            w.v[TURNOVER] = TradingLimits.turnover(today, s.weights());
            long traded = 0;
            for (int i = 0; i < today.length; i++) {
                traded += Math.abs(s.weight(i) - today[i]) > Rebalancer.ZERO_TRADE ? 1 : 0;
            }
            w.v[TRADES] = traded;
        }
        return done(w, weightRows(w, s), List.of(), s);
    }

    /** The figures of a solution in the results row. */
    private void solutionValues(Work w, Solution s) {
        w.v[METHOD] = s.method().label();
        w.v[RETURN] = s.expectedReturn();
        w.v[VOLATILITY] = s.volatility();
        w.v[VARIANCE] = s.variance();
        s.multiplier("target_return").ifPresent(m -> {
            w.v[TARGET_V] = m.variancePerUnit();
            w.v[TARGET_S] = m.volatilityPerUnit();
        });
        w.v[BINDING] = binding(s.multipliers());
        Certificate c = s.certificate();
        w.v[STATIONARITY] = c.stationarity();
        w.v[PRIMAL] = c.primal();
        w.v[DUAL] = c.dual();
        w.v[COMPLEMENTARITY] = c.complementarity();
        w.v[CONDITION] = c.conditionNumber();
        w.v[CERTIFIED] = c.passes();
    }

    /** {@code name=∂V* per unit of the limit} of every binding constraint but the budget and the target, separated by "; ". */
    static String binding(List<Multiplier> multipliers) {
        StringBuilder b = new StringBuilder();
        for (Multiplier m : multipliers) {
            if (!m.binding() || m.constraint().equals("budget") || m.constraint().equals("target_return")) {
                continue;
            }
            if (b.length() > 0) {
                b.append("; ");
            }
            b.append(m.constraint()).append('=').append(CsvCells.number(m.variancePerUnit()));
        }
        return b.toString();
    }

    /** The weights rows of a solution, as values (when kept) and text. */
    private Rows weightRows(Work w, Solution s) {
        List<String> assets = s.assets();
        StringBuilder text = new StringBuilder(assets.size() * 40);
        List<Object[]> values = keepValues ? new ArrayList<>(assets.size()) : List.of();
        String idCell = CsvCells.text(w.id);
        String[] cells = assetCells.computeIfAbsent(w.set.name(), k -> {
            String[] c = new String[assets.size()];
            for (int i = 0; i < c.length; i++) {
                c[i] = CsvCells.text(assets.get(i));
            }
            return c;
        });
        for (int i = 0; i < assets.size(); i++) {
            double x = s.weight(i);
            text.append(idCell).append(',').append(cells[i]).append(',').append(CsvCells.number(x)).append('\n');
            if (keepValues) {
                values.add(new Object[] {w.id, assets.get(i), x});
            }
        }
        return new Rows(values, text.toString());
    }

    /** Rows of a table as values (kept only when asked) and as CSV text. */
    private record Rows(List<Object[]> values, String text) {
        static final Rows NONE = new Rows(List.of(), "");
    }

    // ------------------------------------------------------------------ holdings

    /**
     * Today's weights from the row's {@code holding:ASSET} cells or its holdings file; null when it gives neither.
     *
     * @param alignedForRebalance true to check them as the rebalance command does (market values against the fund
     *                            size, the budget) and return the rebalance's {@link Holdings} weights
     */
    private double[] holdingsWeights(Work w, AssetUniverse u, boolean alignedForRebalance) {
        Holdings h = holdings(w, u, alignedForRebalance);
        return h == null ? null : h.weights();
    }

    /**
     * The row's holdings with its fund size, as the rebalance command builds them; null when none.
     *
     * @param check true to check them as the rebalance command does (their sum against the budget)
     */
    private Holdings holdings(Work w, AssetUniverse u, boolean check) {
        BookRow row = w.row;
        List<String> assets = u.assets();
        String path = row.cell(columns.holdings);
        boolean inline = false;
        for (BookColumns.Named c : columns.holdingWeights) {
            inline |= !row.cell(c.column()).isEmpty();
        }
        if (!path.isEmpty() && inline) {
            throw w.error(columns.holdings, "the row gives a holdings file and holding: weights").value(path)
                    .fix("give one of the two").build();
        }
        String sizeText = row.cell(columns.fundSize);
        double size = Double.NaN;
        if (!sizeText.isEmpty()) {
            NumberText.Problem problem = NumberText.problem(sizeText);
            if (problem != null) {
                throw w.error(columns.fundSize, problem.problem()).value(sizeText).fix(problem.fix()).build();
            }
            size = NumberText.parse(sizeText);
            if (!(size > 0)) {
                throw w.error(columns.fundSize, "the fund size must be positive").value(sizeText)
                        .fix("give the fund's size in its currency, or leave the cell blank").build();
            }
        }
        double[] weights;
        String named;
        if (inline) {
            weights = new double[assets.size()];
            for (BookColumns.Named c : columns.holdingWeights) {
                String t = row.cell(c.column());
                if (t.isEmpty()) {
                    continue;
                }
                int i = assets.indexOf(c.name());
                if (i < 0) {
                    throw unknownAsset(w, c.header(), c.name(), assets);
                }
                weights[i] = rate(w, c.column(), t);
            }
            named = book.path();
        } else if (!path.isEmpty()) {
            InputFile f = book.resolve(path);
            PortfolioFile held = (PortfolioFile) cached(holdingFiles, f.path() + "\u0000" + w.set.name(),
                    () -> PortfolioReader.read(f, "holdings", assets, spec.units()));
            w.warnings.addAll(held.warnings());
            weights = held.weights();
            if (held.marketValue().isPresent()) {
                double mv = held.marketValue().getAsDouble();
                if (!Double.isNaN(size) && Math.abs(mv - size) > Holdings.SUM_TOLERANCE * size) {
                    throw InputException.of(String.format(Locale.ROOT, "the market values add up to %.2f but the "
                                    + "book's fund_size is %.2f", mv, size)).file(f.path())
                            .fix("cash is an asset: add the cash balance as a row, or clear fund_size in the book")
                            .build();
                }
                size = mv;
            }
            named = f.path();
        } else {
            return null;
        }
        try {
            Holdings today = Holdings.ofWeights(assets, weights, size);
            if (check) {
                today.alignedTo(u, w.policy.mandate().budget()); // the rebalance command's check, here to name the file
            }
            return today;
        } catch (InputException e) {
            throw inFile(e, named, inline ? w.row.row() : 0);
        }
    }

    /** {@code e} with {@code file} (and the book row) as its place when it names none, as the rebalance command does. */
    private static InputException inFile(InputException e, String file, int row) {
        if (e.file().isPresent()) {
            return e;
        }
        InputException.Builder b = InputException.of(e.problem()).file(file);
        if (row > 0) {
            b.row(row);
        }
        e.row().filter(r -> row == 0).ifPresent(b::row);
        e.line().ifPresent(b::line);
        e.key().ifPresent(b::key);
        e.column().ifPresent(b::column);
        e.asset().ifPresent(b::asset);
        e.value().ifPresent(b::value);
        e.fix().ifPresent(b::fix);
        return b.build();
    }

    // ------------------------------------------------------------------ rebalance

    private PortfolioResult rebalance(Work w) {
        Mandate mandate = common(w);
        AssetUniverse u = w.set.loaded().universe();
        Holdings today = holdings(w, u, true);
        if (today == null) {
            throw w.error(columns.holdings, "the rebalance job needs today's holdings")
                    .fix("give a holdings file in column holdings, or today's weights in holding:ASSET columns")
                    .build();
        }
        TradingLimits limits = TradingLimits.of(w.policy);
        String tau = w.row.cell(columns.maxTurnover);
        if (!tau.isEmpty()) {
            limits = limits.withMaxTurnover(rate(w, columns.maxTurnover, tau));
        }
        String kind = w.row.cell(columns.objective).toLowerCase(Locale.ROOT);
        RebalanceObjective objective;
        switch (kind) {
            case "", "target" -> {
                OptionalDouble t = target(w, w.policy);
                if (t.isEmpty()) {
                    throw w.error(columns.target, "the rebalance objective target needs a return target")
                            .fix("give target_return in the book, set target_return in the policy, or write "
                                    + "same-risk or nearest in column objective").build();
                }
                objective = new RebalanceObjective.TargetReturn(t.getAsDouble());
                w.v[TARGET] = t.getAsDouble();
            }
            case "same-risk" -> objective = new RebalanceObjective.SameRisk();
            case "nearest" -> objective = new RebalanceObjective.Nearest();
            default -> throw w.error(columns.objective, "the rebalance job knows the objectives target, same-risk and "
                    + "nearest").value(kind).fix("write target, same-risk or nearest").build();
        }
        RebalanceResult r = Rebalancer.rebalance(new RebalanceRequest(u, mandate, today, limits, objective, settings),
                w.set.prepared());
        Solution s = r.proposal();
        solutionValues(w, s);
        w.v[BINDING] = binding(r.binding());
        w.v[OBJECTIVE] = r.objective();
        w.v[RETURN] = r.proposedReturn();
        w.v[NET] = r.proposedNetReturn();
        w.v[VOLATILITY] = r.proposedVolatility();
        w.v[TURNOVER] = r.turnover();
        w.v[COST] = r.cost();
        w.v[TE] = r.trackingError();
        r.turnoverPrice().ifPresent(m -> w.v[TURNOVER_V] = m.variancePerUnit());
        long traded = 0;
        StringBuilder text = new StringBuilder();
        List<Object[]> values = new ArrayList<>();
        for (Trade t : r.trades()) {
            if (t.side() == Trade.Side.HOLD) {
                continue;
            }
            traded++;
            Object[] row = {w.id, t.asset(), t.current(), t.target(), t.trade(), t.amount(), t.cost(),
                    t.side().label()};
            text.append(BookTables.TRADES.line(row));
            if (keepValues) {
                values.add(row);
            }
        }
        w.v[TRADES] = traded;
        return done(w, weightRows(w, s), List.of(new Rows(values, text.toString())), r);
    }

    // ------------------------------------------------------------------ stress

    private PortfolioResult stress(Work w) {
        Mandate mandate = common(w);
        AssetUniverse u = w.set.loaded().universe();
        String kind = w.row.cell(columns.objective).toLowerCase(Locale.ROOT);
        if (!kind.isEmpty() && !kind.equals("target")) {
            throw w.error(columns.objective, "the stress job stresses the row's return target").value(kind)
                    .fix("write target or nothing").build();
        }
        OptionalDouble t = target(w, w.policy);
        if (t.isEmpty()) {
            throw w.error(columns.target, "the stress job needs a return target")
                    .fix("give target_return in the book, or set target_return in the policy").build();
        }
        double target = t.getAsDouble();
        w.v[TARGET] = target;
        w.v[OBJECTIVE] = "target";
        List<Scenario> list = scenarios == null ? List.of() : scenarios(w.policyFile, w.policy, w.set);
        StressResult r = Stress.run(new StressRequest(u, mandate, new double[] {target}, list,
                CorrelationRepair.higham(u.assets()), settings), null);
        StringBuilder text = new StringBuilder();
        List<Object[]> values = new ArrayList<>();
        for (ScenarioResult sr : r.scenarios()) {
            ScenarioPoint p = sr.points().get(0);
            Object[] row = {w.id, sr.scenario().name(), p.feasible() ? Status.OPTIMAL.label()
                    : Status.INFEASIBLE.label(), p.target(), p.volatility(), p.change(), p.baseRisk(), p.baseReturn(),
                    p.turnover(), p.marginalRisk(), String.join("; ", p.binding()), p.reason()};
            text.append(BookTables.STRESS.line(row));
            if (keepValues) {
                values.add(row);
            }
        }
        Rows extra = new Rows(values, text.toString());
        TargetPoint base = r.base().points().get(0);
        if (!base.feasible()) {
            return result(w, Status.INFEASIBLE, oneLine(base.reason()), Rows.NONE, List.of(extra), r);
        }
        solutionValues(w, base.solution());
        return done(w, weightRows(w, base.solution()), List.of(extra), r);
    }

    /** The scenarios read against a set's assets and a policy's groups, once per policy file and set. */
    private List<Scenario> scenarios(InputFile policyFile, Policy policy, AssumptionSets.AssumptionSet set) {
        String key = (policyFile == null ? "" : policyFile.path()) + "\u0000" + set.name();
        @SuppressWarnings("unchecked")
        List<Scenario> list = (List<Scenario>) cached(scenarioLists, key, () -> {
            Map<String, List<Integer>> groups = new LinkedHashMap<>();
            if (policy != null) {
                for (Group g : policy.mandate().groups()) {
                    groups.put(g.name(), g.members());
                }
            }
            return ScenarioFile.read(scenarios, set.loaded().assets(), groups, f -> UniverseLoader.load(set.returns(), f,
                    null, null, spec.units(), null).universe().covariance());
        });
        return list;
    }

    // ------------------------------------------------------------------ results

    private PortfolioResult done(Work w, Rows weights, List<Rows> extra, Object detail) {
        return result(w, Status.OPTIMAL, "", weights, extra, detail);
    }

    private PortfolioResult failed(Work w, Status status, String message, IsoriskException e) {
        return result(w, status, oneLine(message), Rows.NONE, List.of(), e);
    }

    private PortfolioResult result(Work w, Status status, String message, Rows weights, List<Rows> extra,
                                   Object detail) {
        w.v[STATUS] = status.label();
        w.v[MESSAGE] = message;
        if (!w.warnings.isEmpty()) {
            w.v[WARNINGS] = String.join(" | ", w.warnings);
        }
        List<Object[]> extraValues = new ArrayList<>();
        StringBuilder extraText = new StringBuilder();
        for (Rows r : extra) {
            extraValues.addAll(r.values());
            extraText.append(r.text());
        }
        return new PortfolioResult(w.row.index(), w.row.row(), w.id, status, message, w.v, weights.values(),
                extraValues, new String[] {R.line(w.v), weights.text(), extraText.toString()},
                spec.json() ? detail : null, (System.nanoTime() - w.started) / 1e6, null);
    }

    private static String oneLine(String s) {
        return s == null ? "" : s.replaceAll("\\s*[\\r\\n]+\\s*", " ").strip();
    }
}
