package org.isorisk.engine.model;

import java.util.AbstractList;
import java.util.Arrays;
import java.util.Collection;
import java.util.Comparator;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.RandomAccess;
import java.util.function.Predicate;
import java.util.function.UnaryOperator;

/**
 * An immutable list of {@link Multiplier}s stored compactly, for solvers that produce many solutions over the
 * same constraints (the thousands of corner portfolios of a frontier, each with two bound multipliers per
 * asset): the constraint names are one {@link Names} table shared by every list made from it, each list keeps
 * only its prices ({@code ∂V*∂limit}, one double per entry), its binding flags (one bit per entry) and the
 * portfolio volatility σ*; the {@link Multiplier} records are made when read, with
 * {@code volatilityPerUnit = variancePerUnit / (2σ*)} (NaN when σ* is not positive).
 *
 * <p>As a list it behaves like {@link List#of}: it equals (and hashes like) any list of the same multipliers in
 * the same order, every mutator throws {@link UnsupportedOperationException}, and {@link Solution} keeps it
 * without copying.
 */
public final class CompactMultipliers extends AbstractList<Multiplier> implements RandomAccess {

    /** Constraint names shared by many lists, with a lookup of each name's first position. */
    public static final class Names {
        private final String[] names;
        private final Map<String, Integer> first;

        /**
         * @param names constraint names in list order (copied); each non-blank
         */
        public Names(List<String> names) {
            this.names = names.toArray(new String[0]);
            this.first = new HashMap<>(2 * this.names.length);
            for (int i = 0; i < this.names.length; i++) {
                String s = this.names[i];
                if (s == null || s.isBlank()) {
                    throw new IllegalArgumentException("a multiplier needs its constraint's name (entry " + i + ")");
                }
                first.putIfAbsent(s, i);
            }
        }

        /** Number of names. */
        public int size() {
            return names.length;
        }

        /** Name at position i. */
        public String get(int i) {
            return names[i];
        }

        /** First position of {@code name}, or -1. */
        public int indexOf(String name) {
            Integer i = first.get(name);
            return i == null ? -1 : i;
        }
    }

    private final Names names;
    private final double[] prices;
    private final long[] binding;
    private final double volatility;

    /**
     * @param names      the constraint names, shared
     * @param prices     {@code ∂V*∂limit} of each name (copied)
     * @param binding    whether each constraint binds (copied into bits)
     * @param volatility the portfolio volatility σ*, for {@code ∂σ*∂limit}
     */
    public CompactMultipliers(Names names, double[] prices, boolean[] binding, double volatility) {
        if (names == null || prices == null || binding == null) {
            throw new IllegalArgumentException("compact multipliers need names, prices and binding flags");
        }
        if (prices.length != names.size() || binding.length != names.size()) {
            throw new IllegalArgumentException("one price and one binding flag per constraint name: " + names.size()
                    + " names, " + prices.length + " prices, " + binding.length + " flags");
        }
        this.names = names;
        this.prices = prices.clone();
        this.binding = new long[(binding.length + 63) >>> 6];
        for (int i = 0; i < binding.length; i++) {
            if (binding[i]) {
                this.binding[i >>> 6] |= 1L << i;
            }
        }
        this.volatility = volatility;
    }

    @Override
    public Multiplier get(int i) {
        if (i < 0 || i >= prices.length) {
            throw new IndexOutOfBoundsException("index " + i + " of " + prices.length + " multipliers");
        }
        double p = prices[i];
        return new Multiplier(names.get(i), p, volatility > 0 ? p / (2 * volatility) : Double.NaN,
                (binding[i >>> 6] & (1L << i)) != 0);
    }

    @Override
    public int size() {
        return prices.length;
    }

    /** The multiplier of the named constraint (its first entry), without scanning the list. */
    public Optional<Multiplier> named(String constraint) {
        int i = names.indexOf(constraint);
        return i < 0 ? Optional.empty() : Optional.of(get(i));
    }

    @Override
    public int indexOf(Object o) {
        if (!(o instanceof Multiplier m)) {
            return -1;
        }
        int i = names.indexOf(m.constraint());
        if (i >= 0 && get(i).equals(m)) {
            return i;
        }
        return super.indexOf(o);
    }

    @Override
    public boolean contains(Object o) {
        return indexOf(o) >= 0;
    }

    @Override
    public boolean equals(Object o) {
        if (o == this) {
            return true;
        }
        if (o instanceof CompactMultipliers c && c.names == names
                && Double.compare(c.volatility, volatility) == 0) {
            return Arrays.equals(c.prices, prices) && Arrays.equals(c.binding, binding);
        }
        return super.equals(o);
    }

    @Override
    public int hashCode() {
        return super.hashCode();
    }

    // Immutable like List.of: every mutator throws, whatever its argument.

    @Override
    public boolean add(Multiplier m) {
        throw immutable();
    }

    @Override
    public void add(int index, Multiplier m) {
        throw immutable();
    }

    @Override
    public boolean addAll(Collection<? extends Multiplier> c) {
        throw immutable();
    }

    @Override
    public boolean addAll(int index, Collection<? extends Multiplier> c) {
        throw immutable();
    }

    @Override
    public Multiplier set(int index, Multiplier m) {
        throw immutable();
    }

    @Override
    public Multiplier remove(int index) {
        throw immutable();
    }

    @Override
    public boolean remove(Object o) {
        throw immutable();
    }

    @Override
    public boolean removeAll(Collection<?> c) {
        throw immutable();
    }

    @Override
    public boolean retainAll(Collection<?> c) {
        throw immutable();
    }

    @Override
    public boolean removeIf(Predicate<? super Multiplier> filter) {
        throw immutable();
    }

    @Override
    public void replaceAll(UnaryOperator<Multiplier> operator) {
        throw immutable();
    }

    @Override
    public void sort(Comparator<? super Multiplier> c) {
        throw immutable();
    }

    @Override
    public void clear() {
        throw immutable();
    }

    @Override
    protected void removeRange(int fromIndex, int toIndex) {
        throw immutable();
    }

    private static UnsupportedOperationException immutable() {
        return new UnsupportedOperationException("the multipliers of a solution cannot be changed");
    }
}
