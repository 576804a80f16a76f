package org.isorisk.bench;

import java.util.LinkedHashMap;
import java.util.Map;

/**
 * The registry of benchmark cases, in the order {@code bench/run all} runs them. A new case is one class
 * implementing {@link BenchCase} and one line here.
 */
public final class Cases {
    private Cases() {
    }

    /** Every case by name. */
    public static Map<String, BenchCase> all() {
        Map<String, BenchCase> cases = new LinkedHashMap<>();
        add(cases, new ClosedFormCase());
        add(cases, new CriticalLineCase());
        add(cases, new QpCase());
        add(cases, new ParametricCase());
        add(cases, new EstimateCase());
        add(cases, new RebalanceStressCase());
        add(cases, new StartupCase());
        add(cases, new BookCase());
        return cases;
    }

    private static void add(Map<String, BenchCase> cases, BenchCase c) {
        if (cases.put(c.name(), c) != null) {
            throw new IllegalStateException("two benchmark cases named " + c.name());
        }
    }
}
