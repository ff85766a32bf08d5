package org.steamtally.dashboard.security;

import java.util.List;
import java.util.concurrent.CopyOnWriteArrayList;

/**
 * Where operator actions are recorded. The daemon's wiring may write them to the store or a file;
 * {@link #inMemory()} keeps them in a list.
 */
public interface AuditLog {

    void record(AuditEntry entry);

    /** The entries recorded so far, oldest first; an implementation that cannot read back returns none. */
    List<AuditEntry> entries();

    /** An audit log held in memory. */
    static AuditLog inMemory() {
        List<AuditEntry> list = new CopyOnWriteArrayList<>();
        return new AuditLog() {
            @Override
            public void record(AuditEntry entry) {
                list.add(entry);
            }

            @Override
            public List<AuditEntry> entries() {
                return List.copyOf(list);
            }
        };
    }
}
