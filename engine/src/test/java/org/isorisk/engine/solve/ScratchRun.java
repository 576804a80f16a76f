package org.isorisk.engine.solve;

import org.isorisk.engine.model.*;

public class ScratchRun {
    public static void main(String[] a) {
        for (int n : new int[] {10, 50, 200, 500, 2000}) {
            AssetUniverse u = GeneratedProblems.universe(n, 42 + n);
            for (Mandate m : new Mandate[] {GeneratedProblems.longOnly(n), GeneratedProblems.withGroups(n)}) {
                SolverSession s = Allocator.session(u, m, null); System.out.println("start n=" + n + " groups=" + m.groups().size());
                long t0 = System.nanoTime();
                Solution sol = s.solve(Objective.minimumVariance());
                long t1 = System.nanoTime();
                ReturnRange rr = s.returnRange();
                double mid = 0.5 * (rr.min() + rr.max());
                Solution t = s.solve(Objective.targetReturn(mid));
                long t2 = System.nanoTime();
                Solution tw = s.solve(Objective.targetReturn(mid + 0.001), t);
                long t3 = System.nanoTime();
                System.out.printf("n=%d mv %.1f ms cert %.2e %s | target %.1f ms cert %.2e %s | warm %.1f ms cert %.2e %s%n", n,
                        (t1 - t0) / 1e6, sol.certificate().worst(), sol.notes().get(0), (t2 - t1) / 1e6,
                        t.certificate().worst(), t.notes().get(0), (t3 - t2) / 1e6, tw.certificate().worst(), tw.notes().get(0));
            }
        }
    }
}
