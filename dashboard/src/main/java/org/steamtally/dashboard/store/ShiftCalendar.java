package org.steamtally.dashboard.store;

import java.time.Instant;
import java.time.LocalDate;
import java.time.LocalTime;
import java.time.ZoneId;
import java.time.ZonedDateTime;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;

/**
 * The site's shift pattern: shifts start every day at the same local wall-clock times in the site's
 * time zone, and each runs until the next start. Shift boundaries are computed from local date and
 * time each day, so they follow daylight-saving changes: in Europe/Berlin a night shift from 22:00 to
 * 06:00 lasts 7 hours on the night the clocks go forward and 9 on the night they go back.
 *
 * <p>A start time that does not exist on a day (it falls in the gap when clocks go forward) moves
 * forward by the length of the gap; one that exists twice (clocks go back) is the earlier instant —
 * {@link ZonedDateTime#of}'s rules.
 */
public final class ShiftCalendar {

    private final ZoneId zone;
    private final List<LocalTime> starts;
    private final List<String> names;

    /**
     * @param zone   the site's time zone, e.g. {@code Europe/Berlin}
     * @param shifts shift name to local start time, at least one, start times distinct; order does
     *               not matter
     */
    public ShiftCalendar(ZoneId zone, Map<String, LocalTime> shifts) {
        this.zone = Objects.requireNonNull(zone, "zone");
        if (shifts.isEmpty()) {
            throw new IllegalArgumentException("a shift calendar needs at least one shift");
        }
        List<Map.Entry<String, LocalTime>> sorted = new ArrayList<>(shifts.entrySet());
        sorted.sort(Map.Entry.comparingByValue());
        this.starts = new ArrayList<>();
        this.names = new ArrayList<>();
        for (Map.Entry<String, LocalTime> e : sorted) {
            if (!starts.isEmpty() && starts.get(starts.size() - 1).equals(e.getValue())) {
                throw new IllegalArgumentException("shifts " + names.get(names.size() - 1) + " and " + e.getKey()
                        + " both start at " + e.getValue());
            }
            starts.add(e.getValue());
            names.add(e.getKey());
        }
    }

    /** Three eight-hour shifts by the wall clock: early 06:00, late 14:00, night 22:00. */
    public static ShiftCalendar threeShifts(ZoneId zone) {
        Map<String, LocalTime> m = new LinkedHashMap<>();
        m.put("early", LocalTime.of(6, 0));
        m.put("late", LocalTime.of(14, 0));
        m.put("night", LocalTime.of(22, 0));
        return new ShiftCalendar(zone, m);
    }

    public ZoneId zone() {
        return zone;
    }

    /** The shift that contains {@code t}. */
    public Shift shiftContaining(Instant t) {
        LocalDate date = t.atZone(zone).toLocalDate().minusDays(1);
        // A shift that starts on the previous day may still run (the night shift); look from there.
        while (true) {
            for (int i = 0; i < starts.size(); i++) {
                Shift s = shift(date, i);
                if (s.contains(t)) {
                    return s;
                }
            }
            date = date.plusDays(1);
        }
    }

    /** The shift following {@code shift}. */
    public Shift next(Shift shift) {
        return shiftContaining(shift.end());
    }

    /** The shift before {@code shift}. */
    public Shift previous(Shift shift) {
        return shiftContaining(shift.start().minusMillis(1));
    }

    /** The shifts of one local date, in order of start. */
    public List<Shift> shiftsOn(LocalDate date) {
        List<Shift> out = new ArrayList<>(starts.size());
        for (int i = 0; i < starts.size(); i++) {
            out.add(shift(date, i));
        }
        return out;
    }

    private Shift shift(LocalDate date, int index) {
        Instant start = ZonedDateTime.of(date, starts.get(index), zone).toInstant();
        Instant end = index + 1 < starts.size()
                ? ZonedDateTime.of(date, starts.get(index + 1), zone).toInstant()
                : ZonedDateTime.of(date.plusDays(1), starts.get(0), zone).toInstant();
        return new Shift(date, names.get(index), start, end);
    }
}
