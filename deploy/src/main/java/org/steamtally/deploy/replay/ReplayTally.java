package org.steamtally.deploy.replay;

/**
 * How a {@code replay} run went.
 *
 * @param linesRead             non-blank input lines
 * @param linesGood             lines that were well-formed readings of a known topic
 * @param linesBad              lines reported and skipped
 * @param firstBadLine          line number (1-based) of the first bad line, or 0
 * @param readingsUnused        good lines whose reading entered no snapshot: bad quality, duplicate,
 *                              superseded by a newer reading or outside the sensor's plausible range
 * @param snapshots             result records written
 * @param snapshotsInvalid      of these, records with at least one invalid state
 * @param evaluationsFailed     snapshots whose evaluation failed or whose result could not be
 *                              written, reported and left out
 */
public record ReplayTally(long linesRead, long linesGood, long linesBad, long firstBadLine, long readingsUnused,
                          long snapshots, long snapshotsInvalid, long evaluationsFailed) {

    /** True when every line was good and every snapshot was evaluated. */
    public boolean complete() {
        return linesBad == 0 && evaluationsFailed == 0;
    }

    /**
     * One line for standard error, e.g. {@code read 7 lines: 6 good, 1 bad (first on line 3);
     * 4 snapshots: 3 with all states valid, 1 with invalid states}.
     */
    public String summary() {
        StringBuilder s = new StringBuilder();
        s.append("read ").append(linesRead).append(linesRead == 1 ? " line: " : " lines: ")
                .append(linesGood).append(" good, ").append(linesBad).append(" bad");
        if (linesBad > 0) {
            s.append(" (first on line ").append(firstBadLine).append(')');
        }
        if (readingsUnused > 0) {
            s.append(", ").append(readingsUnused).append(readingsUnused == 1 ? " reading" : " readings")
                    .append(" not used");
        }
        long valid = snapshots - snapshotsInvalid;
        s.append("; ").append(snapshots).append(snapshots == 1 ? " snapshot: " : " snapshots: ")
                .append(valid).append(" with all states valid, ")
                .append(snapshotsInvalid).append(" with invalid states");
        if (evaluationsFailed > 0) {
            s.append(", ").append(evaluationsFailed).append(" failed to evaluate");
        }
        return s.toString();
    }
}
