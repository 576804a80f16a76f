package org.isorisk.engine.solve;

import org.isorisk.engine.model.*;
import org.isorisk.engine.synthetic.FactorModels;

public class Prof {
    public static void main(String[] a) {
        int n = Integer.parseInt(a[0]);
        AssetUniverse u = FactorModels.universe(n, FactorModels.DEFAULT_SEED);
        Mandate m = FactorModels.longOnlyCapped(n);
        for (int rep = 0; rep < 2; rep++) {
        long t0 = System.nanoTime();
        Factored f = null;
        long t1 = System.nanoTime();
        MandateSweep s = MandateSweep.of(u, m, SolverSettings.defaults());
        s.minimumVarianceReturn();
        long t2 = System.nanoTime();
        var c = s.efficientCorners();
        long t3 = System.nanoTime();
        var ci = s.inefficientCorners();
        long t4 = System.nanoTime();
        int maxF = 0; for (var k : c) maxF = Math.max(maxF, k.free().size());
        System.out.printf("factor+spectrum %.0f ms, walk %.0f ms, corners(%d, max free %d) %.0f ms, ineff %.0f ms%n", (t1-t0)/1e6, (t2-t1)/1e6, c.size(), maxF, (t3-t2)/1e6, (t4-t3)/1e6);
        }
    }
}
