package org.steamtally.dashboard.store;

import java.sql.Connection;
import java.sql.PreparedStatement;
import java.sql.ResultSet;
import java.sql.SQLException;
import java.sql.Statement;
import java.sql.Types;
import java.util.List;

/**
 * The embedded store's table of suspect sensors, {@code reconciliation_suspect}: one row (site,
 * unit, ts, sensor, test_value) per {@code reconciliation} point whose {@code suspect} flag is true,
 * written in the same transaction as the raw rows. The suspect list of a history or shift summary
 * reads it instead of the raw table.
 *
 * <p>Why a table and not an index: an index on the raw table (the former
 * {@code reconciliation_summary}, led by {@code suspect}) was paid on every sensor row of every
 * result, while only the few suspect rows are ever read through it. Here the other rows cost
 * nothing.
 *
 * <p>A database written before this table existed still has {@code reconciliation_summary}; at
 * opening, the table is filled from the raw rows and only then is that index dropped, so a crash
 * in between leaves the index there and the next opening fills the table again
 * ({@link #createSchema}).
 */
final class H2Suspects {

    static final String TABLE = "reconciliation_suspect";

    /** The covering index of the raw table that this table replaces (present in older databases). */
    static final String OLD_INDEX = "reconciliation_summary";

    private static final int SUSPECT = Measurement.RECONCILIATION.fieldIndex("suspect");
    private static final int TEST_VALUE = Measurement.RECONCILIATION.fieldIndex("test_value");

    private static final String COLUMNS = "\"site\", \"unit\", \"ts\", \"sensor\", \"test_value\"";
    static final String INSERT = "INSERT INTO \"" + TABLE + "\" (" + COLUMNS + ") VALUES (?, ?, ?, ?, ?)";
    private static final String MERGE = "MERGE INTO \"" + TABLE + "\" (" + COLUMNS
            + ") KEY (\"site\", \"unit\", \"ts\", \"sensor\") VALUES (?, ?, ?, ?, ?)";
    private static final String DELETE = "DELETE FROM \"" + TABLE
            + "\" WHERE \"site\" = ? AND \"unit\" = ? AND \"ts\" = ? AND \"sensor\" = ?";

    private H2Suspects() {
    }

    /**
     * Creates the table; in a database that still has {@link #OLD_INDEX}, fills it from the raw
     * rows, commits, then drops the index.
     */
    static void createSchema(Connection c) throws SQLException {
        try (Statement st = c.createStatement()) {
            // Time before sensor: each write appends at the end of its unit's rows.
            st.execute("CREATE TABLE IF NOT EXISTS \"" + TABLE + "\" (\"site\" VARCHAR NOT NULL, \"unit\" VARCHAR"
                    + " NOT NULL, \"ts\" BIGINT NOT NULL, \"sensor\" VARCHAR NOT NULL, \"test_value\" DOUBLE PRECISION,"
                    + " PRIMARY KEY (\"site\", \"unit\", \"ts\", \"sensor\"))");
            if (!indexExists(c, OLD_INDEX)) {
                return;
            }
            boolean auto = c.getAutoCommit();
            c.setAutoCommit(false);
            try {
                st.executeUpdate("DELETE FROM \"" + TABLE + "\"");
                st.executeUpdate("INSERT INTO \"" + TABLE + "\" (" + COLUMNS + ") SELECT " + COLUMNS
                        + " FROM \"reconciliation\" WHERE \"suspect\" = TRUE");
                c.commit();
            } catch (SQLException e) {
                c.rollback();
                throw e;
            } finally {
                c.setAutoCommit(auto);
            }
            st.execute("DROP INDEX IF EXISTS \"" + OLD_INDEX + "\"");
        }
    }

    static boolean indexExists(Connection c, String index) throws SQLException {
        try (PreparedStatement ps = c.prepareStatement("SELECT COUNT(*) FROM INFORMATION_SCHEMA.INDEXES"
                + " WHERE TABLE_SCHEMA = SCHEMA() AND INDEX_NAME = ?")) {
            ps.setString(1, index);
            try (ResultSet rs = ps.executeQuery()) {
                rs.next();
                return rs.getLong(1) > 0;
            }
        }
    }

    private static boolean isSuspect(Point p) {
        return Boolean.TRUE.equals(p.value(SUSPECT));
    }

    private static void bindKey(PreparedStatement ps, Point p) throws SQLException {
        ps.setString(1, p.site());
        ps.setString(2, p.unit());
        ps.setLong(3, p.timestampMs());
        ps.setString(4, p.id());
    }

    private static void bindTestValue(PreparedStatement ps, Point p) throws SQLException {
        if (p.value(TEST_VALUE) instanceof Double v) {
            ps.setDouble(5, v);
        } else {
            ps.setNull(5, Types.DOUBLE);
        }
    }

    /**
     * Adds the suspect rows of a batch of new points (every point new, as its plain INSERTs
     * succeeded), with {@code insert} prepared from {@link #INSERT} on the writer's connection,
     * inside its open transaction.
     */
    static void add(PreparedStatement insert, List<Point> reconciliation) throws SQLException {
        boolean any = false;
        for (Point p : reconciliation) {
            if (isSuspect(p)) {
                bindKey(insert, p);
                bindTestValue(insert, p);
                insert.addBatch();
                any = true;
            }
        }
        if (any) {
            insert.executeBatch();
        }
    }

    /**
     * For a batch that may repeat stored points (written with MERGE): each point's row is replaced,
     * so a point that is no longer suspect loses its row and a suspect one has exactly one.
     */
    static void replace(Connection c, List<Point> reconciliation) throws SQLException {
        try (PreparedStatement merge = c.prepareStatement(MERGE);
                PreparedStatement delete = c.prepareStatement(DELETE)) {
            boolean merges = false;
            boolean deletes = false;
            for (Point p : reconciliation) {
                if (isSuspect(p)) {
                    bindKey(merge, p);
                    bindTestValue(merge, p);
                    merge.addBatch();
                    merges = true;
                } else {
                    bindKey(delete, p);
                    delete.addBatch();
                    deletes = true;
                }
            }
            if (merges) {
                merge.executeBatch();
            }
            if (deletes) {
                delete.executeBatch();
            }
        }
    }

    /** Deletes the rows before {@code cutoffMs}. */
    static void purge(Connection c, long cutoffMs) throws SQLException {
        try (PreparedStatement del = c.prepareStatement("DELETE FROM \"" + TABLE + "\" WHERE \"ts\" < ?")) {
            del.setLong(1, cutoffMs);
            del.executeUpdate();
        }
    }

    /** The suspect sensors in a unit's range, most often suspect first (the raw table's query, on this table). */
    static String query() {
        return "SELECT \"sensor\", COUNT(*), MAX(\"test_value\") FROM \"" + TABLE + "\" WHERE \"site\" = ? AND"
                + " \"unit\" = ? AND \"ts\" >= ? AND \"ts\" < ? GROUP BY \"sensor\" ORDER BY 2 DESC, 3 DESC, 1";
    }
}
