package org.steamtally.deploy.props;

/**
 * How a {@code props} run went, row by row.
 *
 * @param read            data rows read (the header and blank lines not counted)
 * @param good            rows whose state was computed
 * @param failed          rows written with an error message instead
 * @param firstFailedLine input line number (1-based, header is line 1) of the first failed row, or 0
 *                        if none failed
 */
public record RowTally(long read, long good, long failed, long firstFailedLine) {

    /** One line for standard error, e.g. {@code read 7 rows: 6 good, 1 failed (first on input line 9)}. */
    public String summary() {
        String text = "read " + read + (read == 1 ? " row" : " rows") + ": " + good + " good, " + failed + " failed";
        return failed == 0 ? text : text + " (first on input line " + firstFailedLine + ")";
    }
}
