package org.isorisk.engine.book;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.concurrent.ConcurrentHashMap;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.error.IsoriskException;
import org.isorisk.engine.io.Csv;
import org.isorisk.engine.io.CsvRow;
import org.isorisk.engine.io.CsvTable;
import org.isorisk.engine.io.InputFile;
import org.isorisk.engine.io.LoadedUniverse;
import org.isorisk.engine.io.UniverseLoader;
import org.isorisk.engine.io.Units;
import org.isorisk.engine.model.SolverSettings;
import org.isorisk.engine.solve.Allocator;
import org.isorisk.engine.solve.Factored;

/**
 * The assumption sets a book's rows may name in their {@code assumptions} column, e.g. a base case and stress
 * cases. The sets file is a CSV of our own layout, one set per row:
 * {@code name,expected_returns,covariance} (or {@code volatilities} and {@code correlation} instead of
 * {@code covariance}), the paths relative to the sets file. A row with a blank {@code assumptions} cell uses the
 * run's own files ({@link #OWN}). Each set is read and factored once, when a row first needs it; a set whose files
 * are bad fails the rows that name it, with the reader's message. Thread-safe.
 */
public final class AssumptionSets {

    /** The name under which the run's own assumption files are kept (rows with a blank cell). */
    public static final String OWN = "";

    /** The layout of the sets file, as named in messages. */
    public static final String LAYOUT = "name,expected_returns,covariance (or volatilities and correlation instead of "
            + "covariance), paths relative to this file";

    /** One set: where its files are. */
    private record Entry(String name, InputFile returns, InputFile covariance, InputFile volatilities,
                         InputFile correlation) {
    }

    private final Map<String, Entry> entries;
    private final Units units;
    private final SolverSettings settings;
    private final Map<String, Object> loaded = new ConcurrentHashMap<>();

    private AssumptionSets(Map<String, Entry> entries, Units units, SolverSettings settings) {
        this.entries = entries;
        this.units = units;
        this.settings = settings;
    }

    /**
     * The sets of a run.
     *
     * @param own      the run's own files (returns, covariance, volatilities, correlation; any may be null), kept
     *                 under {@link #OWN}; all null when the run has none
     * @param setsFile the sets file; null when none
     * @param settings the factorisation's settings (one thread for a book run in parallel)
     * @throws InputException when the sets file cannot be read or is not in its layout (the whole run stops)
     */
    public static AssumptionSets of(InputFile[] own, InputFile setsFile, Units units, SolverSettings settings) {
        Map<String, Entry> entries = new LinkedHashMap<>();
        if (own[0] != null || own[1] != null || own[2] != null || own[3] != null) {
            entries.put(OWN, new Entry(OWN, own[0], own[1], own[2], own[3]));
        }
        if (setsFile != null) {
            CsvTable t = Csv.read(setsFile, "assumption-sets");
            int name = t.requireColumn("name", "the layout is " + LAYOUT);
            int mu = t.requireColumn("expected_returns", "the layout is " + LAYOUT);
            int cov = t.column("covariance");
            int vol = t.column("volatilities");
            int cor = t.column("correlation");
            for (CsvRow r : t.rows()) {
                String n = r.cell(name).strip();
                if (n.isEmpty()) {
                    throw t.error("the set has no name").row(r.number()).column("name")
                            .fix("give every set a name (rows of the book name it in their assumptions column)")
                            .build();
                }
                if (entries.containsKey(n) && !n.equals(OWN)) {
                    throw t.error("the set name is used twice").row(r.number()).column("name").value(n)
                            .fix("give every set its own name").build();
                }
                String c = cov < 0 ? "" : r.cell(cov).strip();
                String v = vol < 0 ? "" : r.cell(vol).strip();
                String k = cor < 0 ? "" : r.cell(cor).strip();
                String m = r.cell(mu).strip();
                if (m.isEmpty() || c.isEmpty() == (v.isEmpty() || k.isEmpty())) {
                    throw t.error("the set needs an expected-returns file and either a covariance file or "
                            + "volatilities with a correlation file").row(r.number()).value(n)
                            .fix("fill expected_returns and covariance (or volatilities and correlation)").build();
                }
                entries.put(n, new Entry(n, setsFile.resolve(m), c.isEmpty() ? null : setsFile.resolve(c),
                        v.isEmpty() ? null : setsFile.resolve(v), k.isEmpty() ? null : setsFile.resolve(k)));
            }
        }
        return new AssumptionSets(entries, units, settings);
    }

    /** The names of the named sets, in the order of the sets file. */
    public List<String> names() {
        List<String> out = new ArrayList<>();
        for (String n : entries.keySet()) {
            if (!n.equals(OWN)) {
                out.add(n);
            }
        }
        return out;
    }

    /** True when a set of that name exists ({@link #OWN} for the run's own files). */
    public boolean has(String name) {
        return entries.containsKey(name);
    }

    /**
     * The set, read and factored on first use.
     *
     * @throws InputException when its files are bad (every row naming it gets this message); also for a name that
     *                        is not a set ({@link #has} first)
     */
    public AssumptionSet get(String name) {
        Object o = loaded.computeIfAbsent(name, this::load);
        if (o instanceof IsoriskException e) {
            throw e;
        }
        return (AssumptionSet) o;
    }

    private Object load(String name) {
        Entry e = entries.get(name);
        if (e == null) {
            return InputException.of("no assumption set named '" + name + "'").build();
        }
        try {
            LoadedUniverse u = UniverseLoader.load(e.returns(), e.covariance(), e.volatilities(), e.correlation(),
                    units, null);
            if (!u.hasExpectedReturns()) {
                return InputException.of("the assumption set has no expected returns").value(name)
                        .fix("give its expected-returns file").build();
            }
            Factored f = Allocator.prepare(u.universe(), settings);
            return new AssumptionSet(name, u, f, e.returns());
        } catch (IsoriskException x) {
            return x;
        }
    }

    /**
     * One set, read and factored.
     *
     * @param name     its name ({@link #OWN} for the run's own files)
     * @param loaded   the universe with its provenance and warnings
     * @param prepared Σ factored once for every row that uses the set
     * @param returns  its expected-returns file (a stress scenario's replacement covariance is matched to it)
     */
    public record AssumptionSet(String name, LoadedUniverse loaded, Factored prepared, InputFile returns) {
    }
}
