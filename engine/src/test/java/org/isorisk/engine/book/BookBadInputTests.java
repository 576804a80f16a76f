package org.isorisk.engine.book;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Path;
import java.util.List;
import org.isorisk.engine.SampleFund;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.io.InputFile;
import org.isorisk.engine.model.Status;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Bad input in a book: a row that is wrong becomes a row with its status and one-line message (book file, row,
 * column, or the file it names), and every other row still runs; a book that cannot be read at all is refused
 * before any work.
 */
class BookBadInputTests {

    @TempDir
    Path dir;

    private Path policy() throws IOException {
        return BookFixture.write(dir, "policies/long-only.yaml", "budget: 1\nbounds:\n  default: {min: 0, max: 0.4}\n"
                + "groups:\n  Equity:\n    members: [Domestic Equity, Foreign Developed Equity, Emerging Equity]\n"
                + "    max: 0.6\n");
    }

    @Test
    void eachBadRowFailsWithItsMessageAndTheOthersRun() throws IOException {
        policy();
        Path book = BookFixture.write(dir, "book.csv", String.join("\n",
                "id,policy,target_return,assumptions,exclude,max:Cash,group_max:Equty,max:Gold",
                "good,policies/long-only.yaml,0.05,,,,,",
                "missing-policy,policies/none.yaml,0.05,,,,,",
                "unknown-set,policies/long-only.yaml,0.05,stres,,,,",
                "bad-exclude,policies/long-only.yaml,0.05,,Cassh,,,",
                "good,policies/long-only.yaml,0.05,,,,,",
                ",policies/long-only.yaml,0.05,,,,,",
                "bad-number,policies/long-only.yaml,\"0,05\",,,,,",
                "no-group,policies/long-only.yaml,0.05,,,,0.5,",
                "unknown-asset,policies/long-only.yaml,0.05,,,,,0.1",
                "too-high,policies/long-only.yaml,0.20,,,,,",
                "min-above-max,policies/long-only.yaml,0.05,,,-0.1,,",
                "good-2,policies/long-only.yaml,0.05,higher-inflation,Commodities,0.02,,",
                ""));
        BookFixture.Ran ran = BookFixture.run(BookFixture.own(Job.SOLVE, book, null), null, 1);
        String f = book.toString();
        String p = dir.resolve("policies/none.yaml").toString();
        List<String[]> expected = List.of(
                new String[] {"optimal", ""},
                new String[] {"invalid-input", p + ": cannot read the policy file: " + p
                        + "; fix: check the path given to --policy"},
                new String[] {"invalid-input", f + ", row 4, column 'assumptions': no assumption set named 'stres' "
                        + "(value 'stres'); fix: use one of: base, higher-inflation"},
                new String[] {"invalid-input", f + ", row 5, column 'exclude', asset 'Cassh': the asset is not in the "
                        + "assumption set; fix: use the names of the expected-returns file"},
                new String[] {"invalid-input", f + ", row 6, column 'id': the id is also the id of row 2 (value "
                        + "'good'); fix: give every portfolio its own id"},
                new String[] {"invalid-input", f + ", row 7, column 'id': the id is blank; fix: give every portfolio "
                        + "an id"},
                new String[] {"invalid-input", f + ", row 8, column 'target_return': the number uses a decimal comma "
                        + "(value '0,05'); fix: write numbers with a decimal point (0.05, not 0,05) and use commas "
                        + "only between cells; in a spreadsheet, export as CSV with '.' as the decimal separator"},
                new String[] {"invalid-input", f + ", row 9, column 'group_max:Equty': the policy ("
                        + dir.resolve("policies/long-only.yaml") + ") has no group 'Equty' to override (value '0.5'); "
                        + "fix: use one of its groups: Equity"},
                new String[] {"invalid-input", f + ", row 10, column 'max:Gold', asset 'Gold': the asset is not in "
                        + "the assumption set; fix: use the names of the expected-returns file"},
                new String[] {"infeasible", null},
                new String[] {"invalid-input", f + ", row 12, column 'max:Cash', asset 'Cash': the asset's min 0.00 % "
                        + "is above its max -10.00 % (value '-0.1'); fix: make min at most max"},
                new String[] {"optimal", ""});
        assertEquals(expected.size(), ran.rows().size());
        for (int k = 0; k < expected.size(); k++) {
            PortfolioResult r = ran.row(k);
            assertEquals(expected.get(k)[0], r.status().label(), r.id() + ": " + r.message());
            if (expected.get(k)[1] != null) {
                assertEquals(expected.get(k)[1], r.message(), r.id());
            }
        }
        // the numerical QP's own message (the policy has a group), as `isorisk solve` prints it
        assertEquals("the target return 20.00 % is above the highest expected return the mandate allows, 7.30 % "
                + "(achievable range 2.90 % to 7.30 %); the portfolio at that end holds Emerging Equity 40.00 %, "
                + "Listed Real Estate 40.00 %, Domestic Equity 20.00 %; fix: choose a target between 2.90 % and "
                + "7.30 %", ran.row(9).message());
        assertEquals(2, ran.outcome().summary().count(Status.OPTIMAL));
        assertEquals(1, ran.outcome().summary().count(Status.INFEASIBLE));
        assertEquals(9, ran.outcome().summary().count(Status.INVALID_INPUT));
        assertEquals(Status.INVALID_INPUT, ran.outcome().summary().worst());
        // failed rows have no weights; the good ones have all twelve
        assertEquals(1 + 2 * 12, ran.weights().lines().count());
    }

    @Test
    void aBookThatCannotBeReadAtAllIsRefusedBeforeAnyWork() throws IOException {
        Path noPolicy = BookFixture.write(dir, "a.csv", "id,polcy,target_return\nx,p.yaml,0.05\n");
        assertEquals(noPolicy + ": no column named 'policy' in the header (row 1) (value 'id,polcy,target_return'); "
                + "fix: did you mean 'polcy'? Name the column policy", assertThrows(InputException.class,
                () -> Book.scan(InputFile.of(noPolicy))).getMessage());
        Path ragged = BookFixture.write(dir, "b.csv", "id,policy,target_return\nx,p.yaml,0.05\ny,p.yaml\n");
        assertEquals(ragged + ", row 3: the row has 2 cells but the header has 3 (id, policy, target_return) (value "
                + "'y,p.yaml'); fix: give every row one cell per header column", assertThrows(InputException.class,
                () -> Book.scan(InputFile.of(ragged))).getMessage());
        Path empty = BookFixture.write(dir, "c.csv", "id,policy,target_return\n");
        assertEquals(empty + ", row 1: the file has a header but no data rows; fix: add one row per asset below the "
                + "header", assertThrows(InputException.class, () -> Book.scan(InputFile.of(empty))).getMessage());
        Path none = dir.resolve("missing.csv");
        assertEquals(none + ": the book file does not exist; fix: check the path; a relative path starts from the "
                + "current folder", assertThrows(InputException.class, () -> Book.scan(InputFile.of(none)))
                .getMessage());
        Path prefix = BookFixture.write(dir, "d.csv", "id,policy,target_return,max:\nx,p.yaml,0.05,0.1\n");
        assertEquals(prefix + ", row 1, column 'max:': the column names no asset after 'max:'; fix: write the name "
                + "after the colon, e.g. max:Cash", assertThrows(InputException.class,
                () -> Book.scan(InputFile.of(prefix))).getMessage());
    }

    @Test
    void columnsThatAreNotBookColumnsAreIgnoredWithAWarning() throws IOException {
        Path book = BookFixture.write(dir, "e.csv", "id,policy,target_return,client,exlude\nx,p.yaml,0.05,A,\n");
        Book b = Book.scan(InputFile.of(book));
        assertEquals(List.of(book + ": column 'client' is not a book column and is ignored",
                book + ": column 'exlude' is not a book column and is ignored (did you mean 'exclude'?)"),
                b.warnings());
    }

    @Test
    void theRunsOwnFilesAndSharedPolicyAreCheckedBeforeAnyWork() throws IOException {
        Path book = BookFixture.write(dir, "f.csv", "id,policy,target_return\nx,,0.05\n");
        Path broken = BookFixture.write(dir, "shared.yaml", "budget: 1\nbounds: {default: {min: 0, max: 0.4}}\n"
                + "fixed: {Gold: 0.1}\n");
        BookSpec spec = BookFixture.own(Job.SOLVE, book, broken.toString());
        InputException e = assertThrows(InputException.class, () -> BookJob.open(spec,
                Book.scan(InputFile.of(book)).columns(), s -> InputFile.of(Path.of(s)), false));
        assertTrue(e.getMessage().startsWith(broken + ", line 3, key 'fixed.Gold'"), e.getMessage());
        BookSpec noReturns = new BookSpec(Job.SOLVE, book.toString(), dir.resolve("nowhere.csv").toString(),
                SampleFund.DATA.resolve("covariance.csv").toString(), null, null, null, null, null, null, false);
        assertEquals(dir.resolve("nowhere.csv") + ": the expected returns file does not exist; fix: check the path; a "
                + "relative path starts from the current folder", assertThrows(InputException.class,
                () -> BookJob.open(noReturns, Book.scan(InputFile.of(book)).columns(), s -> InputFile.of(Path.of(s)),
                        false)).getMessage());
    }

    @Test
    void theRebalanceJobNeedsHoldingsAndNamesAMissingHoldingsFile() throws IOException {
        policy();
        Path book = BookFixture.write(dir, "g.csv", String.join("\n",
                "id,policy,target_return,holdings,holding:Cash,holding:Government Bonds,objective",
                "none,policies/long-only.yaml,0.04,,,,",
                "missing,policies/long-only.yaml,0.04,held/none.csv,,,",
                "inline,policies/long-only.yaml,0.04,,0.5,0.5,",
                "both,policies/long-only.yaml,0.04,held/none.csv,0.5,0.5,",
                "off-budget,policies/long-only.yaml,0.04,,0.5,0.4,",
                "nearest,policies/long-only.yaml,,,0.5,0.5,nearest",
                "odd-objective,policies/long-only.yaml,0.04,,0.5,0.5,biggest",
                ""));
        BookFixture.Ran ran = BookFixture.run(BookFixture.own(Job.REBALANCE, book, null), null, 1);
        String f = book.toString();
        assertEquals(f + ", row 2, column 'holdings': the rebalance job needs today's holdings; fix: give a holdings "
                + "file in column holdings, or today's weights in holding:ASSET columns", ran.row(0).message());
        assertEquals(dir.resolve("held/none.csv") + ": the holdings file does not exist; fix: check the path; a "
                + "relative path starts from the current folder", ran.row(1).message());
        assertEquals("optimal", ran.row(2).status().label(), ran.row(2).message());
        assertEquals(f + ", row 5, column 'holdings': the row gives a holdings file and holding: weights (value "
                + "'held/none.csv'); fix: give one of the two", ran.row(3).message());
        assertEquals("invalid-input", ran.row(4).status().label());
        assertTrue(ran.row(4).message().startsWith(f + ", row 6: "), ran.row(4).message());
        assertEquals("optimal", ran.row(5).status().label(), ran.row(5).message());
        assertEquals(f + ", row 8, column 'objective': the rebalance job knows the objectives target, same-risk and "
                + "nearest (value 'biggest'); fix: write target, same-risk or nearest", ran.row(6).message());
    }
}
