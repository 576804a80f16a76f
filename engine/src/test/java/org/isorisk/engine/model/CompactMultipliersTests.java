package org.isorisk.engine.model;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNotEquals;
import static org.junit.jupiter.api.Assertions.assertSame;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.Iterator;
import java.util.List;
import java.util.ListIterator;
import java.util.Optional;
import org.junit.jupiter.api.Test;

/**
 * The compact multiplier list against the contract of {@link java.util.List} (JDK documentation: equals and
 * hashCode defined element by element, so that any two lists of equal elements in the same order are equal) and
 * against {@link List#of} built from the same records (an independent implementation in the JDK).
 */
class CompactMultipliersTests {

    // More than 64 entries, so that the binding flags span several words of bits.
    private static final int ASSETS = 40;

    private static CompactMultipliers.Names names() {
        List<String> n = new ArrayList<>();
        n.add("budget");
        n.add("target_return");
        for (int i = 0; i < ASSETS; i++) {
            n.add("lower:A" + i);
            n.add("upper:A" + i);
        }
        return new CompactMultipliers.Names(n);
    }

    private static double price(int j) {
        return j % 3 == 0 ? 0.0 : (j % 2 == 0 ? 1 : -1) * 0.001 * j;
    }

    private static boolean binds(int j) {
        return j < 2 || j % 5 == 1;
    }

    /** The same multipliers made one record at a time, as a solver without the compact form makes them. */
    private static List<Multiplier> records(CompactMultipliers.Names names, double vol) {
        List<Multiplier> out = new ArrayList<>();
        for (int j = 0; j < names.size(); j++) {
            out.add(new Multiplier(names.get(j), price(j), vol > 0 ? price(j) / (2 * vol) : Double.NaN, binds(j)));
        }
        return out;
    }

    private static CompactMultipliers compact(CompactMultipliers.Names names, double vol) {
        double[] p = new double[names.size()];
        boolean[] b = new boolean[names.size()];
        for (int j = 0; j < p.length; j++) {
            p[j] = price(j);
            b[j] = binds(j);
        }
        return new CompactMultipliers(names, p, b, vol);
    }

    @Test
    void itEqualsAndHashesLikeAListOfTheSameRecords() {
        CompactMultipliers.Names names = names();
        CompactMultipliers c = compact(names, 0.12);
        List<Multiplier> expected = List.copyOf(records(names, 0.12));
        assertEquals(expected.size(), c.size());
        for (int j = 0; j < c.size(); j++) {
            assertEquals(expected.get(j), c.get(j), "entry " + j);
        }
        assertEquals(expected, c);
        assertEquals(c, expected);
        assertEquals(expected.hashCode(), c.hashCode());
        assertEquals(List.copyOf(c), c);
        assertEquals(expected.toString(), c.toString());
        assertEquals(new ArrayList<>(c), expected);
    }

    @Test
    void aZeroVolatilityGivesNotANumberPerUnitOfVolatilityLikeTheRecordsDo() {
        CompactMultipliers.Names names = names();
        CompactMultipliers c = compact(names, 0.0);
        assertTrue(Double.isNaN(c.get(1).volatilityPerUnit()));
        assertEquals(List.copyOf(records(names, 0.0)), c);
    }

    @Test
    void listsThatDifferInOnePriceOrOneFlagOrTheVolatilityAreNotEqual() {
        CompactMultipliers.Names names = names();
        CompactMultipliers c = compact(names, 0.12);
        double[] p = new double[names.size()];
        boolean[] b = new boolean[names.size()];
        for (int j = 0; j < p.length; j++) {
            p[j] = price(j);
            b[j] = binds(j);
        }
        assertEquals(c, new CompactMultipliers(names, p, b, 0.12), "same names table, same values");
        assertEquals(c, new CompactMultipliers(names(), p, b, 0.12), "an equal table built apart");
        p[70] += 1e-9;
        assertNotEquals(c, new CompactMultipliers(names, p, b, 0.12));
        p[70] = price(70);
        b[70] = !b[70];
        CompactMultipliers flipped = new CompactMultipliers(names, p, b, 0.12);
        assertNotEquals(c, flipped);
        assertEquals(!binds(70), flipped.get(70).binding(), "a flag in the second word of bits");
        b[70] = binds(70);
        assertNotEquals(c, new CompactMultipliers(names, p, b, 0.13));
        assertNotEquals(c, List.copyOf(records(names, 0.12)).subList(0, 10));
    }

    @Test
    void itCopiesItsInputs() {
        CompactMultipliers.Names names = names();
        double[] p = new double[names.size()];
        boolean[] b = new boolean[names.size()];
        p[0] = 0.5;
        b[0] = true;
        CompactMultipliers c = new CompactMultipliers(names, p, b, 0.1);
        p[0] = 9;
        b[0] = false;
        assertEquals(0.5, c.get(0).variancePerUnit(), 0.0);
        assertTrue(c.get(0).binding());
    }

    @Test
    void everyMutatorThrowsAsOnListOf() {
        CompactMultipliers c = compact(names(), 0.12);
        Multiplier m = c.get(0);
        assertThrows(UnsupportedOperationException.class, () -> c.add(m));
        assertThrows(UnsupportedOperationException.class, () -> c.add(0, m));
        assertThrows(UnsupportedOperationException.class, () -> c.set(0, m));
        assertThrows(UnsupportedOperationException.class, () -> c.remove(0));
        assertThrows(UnsupportedOperationException.class, () -> c.remove(m));
        assertThrows(UnsupportedOperationException.class, () -> c.addAll(List.of(m)));
        assertThrows(UnsupportedOperationException.class, () -> c.removeAll(List.of()));
        assertThrows(UnsupportedOperationException.class, () -> c.retainAll(List.of()));
        assertThrows(UnsupportedOperationException.class, () -> c.removeIf(x -> false));
        assertThrows(UnsupportedOperationException.class, () -> c.replaceAll(x -> x));
        assertThrows(UnsupportedOperationException.class, () -> c.sort(null));
        assertThrows(UnsupportedOperationException.class, c::clear);
        assertThrows(UnsupportedOperationException.class, () -> c.subList(0, 3).clear());
        Iterator<Multiplier> it = c.iterator();
        it.next();
        assertThrows(UnsupportedOperationException.class, it::remove);
        ListIterator<Multiplier> li = c.listIterator();
        li.next();
        assertThrows(UnsupportedOperationException.class, () -> li.set(m));
        assertThrows(IndexOutOfBoundsException.class, () -> c.get(c.size()));
        assertThrows(IndexOutOfBoundsException.class, () -> c.get(-1));
        assertEquals(compact(names(), 0.12), c, "unchanged");
    }

    @Test
    void lookupsByNameAndByElementFindTheFirstEntry() {
        CompactMultipliers.Names names = new CompactMultipliers.Names(List.of("budget", "lower:A", "lower:A"));
        CompactMultipliers c = new CompactMultipliers(names, new double[] {1, 2, 3}, new boolean[] {true, false, true},
                0.2);
        assertEquals(Optional.of(new Multiplier("lower:A", 2, 2 / 0.4, false)), c.named("lower:A"));
        assertTrue(c.named("upper:A").isEmpty());
        assertEquals(2, c.indexOf(new Multiplier("lower:A", 3, 3 / 0.4, true)), "a later entry of the same name");
        assertEquals(-1, c.indexOf(new Multiplier("lower:A", 4, 4 / 0.4, true)));
        assertEquals(-1, c.indexOf("lower:A"));
        assertTrue(c.contains(c.get(1)));
        assertFalse(c.contains(new Multiplier("budget", 1, 1 / 0.4, false)));
        assertEquals(1, names.indexOf("lower:A"));
        assertEquals(-1, names.indexOf("lower:B"));
    }

    @Test
    void aSolutionKeepsTheCompactListAndFindsItsMultipliers() {
        CompactMultipliers.Names names = names();
        CompactMultipliers c = compact(names, 0.12);
        double[] w = new double[] {1};
        Certificate cert = new Certificate(0, 0, 0, 0, 1, 1e-7, true);
        Solution s = new Solution(Method.CRITICAL_LINE, List.of("A"), w, 0.05, 0.0144, 0.12, c, cert, List.of());
        assertSame(c, s.multipliers());
        Solution plain = new Solution(Method.CRITICAL_LINE, List.of("A"), w, 0.05, 0.0144, 0.12,
                records(names, 0.12), cert, List.of());
        assertEquals(plain, s);
        assertEquals(s, plain);
        assertEquals(plain.multiplier("upper:A7"), s.multiplier("upper:A7"));
        assertEquals(plain.multiplier("target_return"), s.multiplier("target_return"));
        assertTrue(s.multiplier("group:X:max").isEmpty());
        assertEquals(plain.binding(), s.binding());
    }

    @Test
    void badInputIsRefused() {
        CompactMultipliers.Names names = names();
        assertThrows(IllegalArgumentException.class, () -> new CompactMultipliers.Names(List.of("budget", " ")));
        assertThrows(IllegalArgumentException.class,
                () -> new CompactMultipliers(names, new double[3], new boolean[names.size()], 0.1));
        assertThrows(IllegalArgumentException.class,
                () -> new CompactMultipliers(names, new double[names.size()], new boolean[3], 0.1));
        assertThrows(IllegalArgumentException.class, () -> new CompactMultipliers(null, new double[0],
                new boolean[0], 0.1));
    }
}
