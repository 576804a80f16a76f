package org.isorisk.engine.estimate;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import java.time.LocalDate;
import org.isorisk.engine.error.InputException;
import org.junit.jupiter.api.Test;

class FrequencyTests {

    private static LocalDate[] every(LocalDate start, int days, int count) {
        LocalDate[] d = new LocalDate[count];
        for (int t = 0; t < count; t++) {
            d[t] = start.plusDays((long) days * t);
        }
        return d;
    }

    @Test
    void weekdaysWithWeekendsAndHolidaysAreDaily() {
        LocalDate[] d = Histories.weekdays(300);
        d = java.util.Arrays.stream(d).filter(x -> !x.equals(LocalDate.of(2020, 4, 10))
                && !x.equals(LocalDate.of(2020, 4, 13))).toArray(LocalDate[]::new); // a four-day holiday weekend
        Frequency.Detection f = Frequency.detect(d, "h.csv");
        assertEquals(Frequency.DAILY, f.frequency());
        assertEquals(1, f.medianGapDays(), 0);
    }

    @Test
    void fridaysAreWeeklyMonthEndsMonthlyQuarterEndsQuarterly() {
        assertEquals(Frequency.WEEKLY, Frequency.detect(every(LocalDate.of(2020, 1, 3), 7, 60), "w").frequency());
        LocalDate[] months = new LocalDate[30];
        LocalDate[] quarters = new LocalDate[30];
        for (int t = 0; t < 30; t++) {
            months[t] = LocalDate.of(2018, 1, 1).plusMonths(t + 1).minusDays(1);
            quarters[t] = LocalDate.of(2010, 1, 1).plusMonths(3L * (t + 1)).minusDays(1);
        }
        assertEquals(Frequency.MONTHLY, Frequency.detect(months, "m").frequency());
        assertEquals(Frequency.QUARTERLY, Frequency.detect(quarters, "q").frequency());
    }

    @Test
    void theConventionsAre252And52And12And4() {
        // 252 trading days: common practice, no source; 52 weeks, 12 months, 4 quarters by the calendar.
        assertEquals(252, Frequency.DAILY.periodsPerYear());
        assertEquals(52, Frequency.WEEKLY.periodsPerYear());
        assertEquals(12, Frequency.MONTHLY.periodsPerYear());
        assertEquals(4, Frequency.QUARTERLY.periodsPerYear());
    }

    @Test
    void aMedianBetweenTheRangesIsNotGuessed() {
        assertThrows(InputException.class, () -> Frequency.detect(every(LocalDate.of(2020, 1, 1), 14, 30), "b"));
        assertThrows(InputException.class, () -> Frequency.detect(every(LocalDate.of(2020, 1, 1), 60, 30), "b"));
    }
}
