package org.steamtally.dashboard.store;

import java.io.Closeable;
import java.io.IOException;
import java.nio.ByteBuffer;
import java.nio.channels.FileChannel;
import java.nio.file.DirectoryStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.util.ArrayDeque;
import java.util.ArrayList;
import java.util.Deque;
import java.util.List;
import java.util.zip.CRC32C;

/**
 * An append-only journal of opaque records in numbered segment files under one directory.
 *
 * <p>Each record is framed as {@code int length, int CRC32C(payload), payload} (big-endian), so a
 * record cut short by a crash, or one whose bytes were damaged, is recognised on reading. On
 * opening, each segment is scanned; at the first record that is short or fails its checksum the
 * segment is truncated, so a torn tail left by a crash is skipped and appends continue after the
 * last whole record.
 *
 * <p>Records are read in append order from a read position that {@link #acknowledge} moves; a fully
 * read segment is deleted. The journal's size is bounded: when an append takes it over its limit,
 * whole segments are dropped oldest first and the number of records lost is returned.
 * {@link #sync()} forces written bytes to the device; the caller schedules it. Thread-safe: every
 * method holds the journal's lock, except the force of {@link #sync()} itself.
 */
final class Journal implements Closeable {

    static final int HEADER_BYTES = 8;
    /** Larger lengths are not records of ours but damage; a point encodes to a few hundred bytes. */
    static final int MAX_RECORD_BYTES = 1 << 20;
    /** Bytes read at once by {@link #peek}: about a thousand points' records. */
    private static final int PEEK_CHUNK_BYTES = 256 * 1024;

    private static final String PREFIX = "spool-";
    private static final String SUFFIX = ".log";

    private static final System.Logger LOG = System.getLogger(Journal.class.getName());

    private final Path dir;
    private final long maxBytes;
    private final long segmentBytes;
    private final Deque<Segment> segments = new ArrayDeque<>();
    private FileChannel writer;
    private boolean dirty;
    private long readOffset;
    private int readRecordsInSegment;
    private int peeked;
    private long peekedEnd;
    private long totalBytes;
    private long pendingRecords;
    private final long recoveredTornBytes;

    private static final class Segment {
        final long number;
        final Path path;
        long bytes;
        int records;
        FileChannel reader;

        Segment(long number, Path path) {
            this.number = number;
            this.path = path;
        }
    }

    /**
     * Opens (creating if needed) the journal in {@code dir}, recovering each segment up to its last
     * whole record.
     *
     * @param maxBytes     bound on the total size of all segments, &gt; 2 × segmentBytes
     * @param segmentBytes size at which a new segment is started
     */
    Journal(Path dir, long maxBytes, long segmentBytes) throws IOException {
        if (segmentBytes <= HEADER_BYTES || maxBytes < 2 * segmentBytes) {
            throw new IllegalArgumentException("journal: maxBytes " + maxBytes + " must be at least twice segmentBytes "
                    + segmentBytes + ", which must exceed " + HEADER_BYTES);
        }
        this.dir = dir;
        this.maxBytes = maxBytes;
        this.segmentBytes = segmentBytes;
        Files.createDirectories(dir);
        List<Path> files = new ArrayList<>();
        try (DirectoryStream<Path> ds = Files.newDirectoryStream(dir, PREFIX + "*" + SUFFIX)) {
            ds.forEach(files::add);
        }
        files.sort(null);
        long torn = 0;
        for (Path f : files) {
            String name = f.getFileName().toString();
            long number = Long.parseLong(name.substring(PREFIX.length(), name.length() - SUFFIX.length()));
            Segment s = new Segment(number, f);
            torn += recover(s);
            if (s.records == 0) {
                Files.delete(f);
                continue;
            }
            segments.addLast(s);
            totalBytes += s.bytes;
            pendingRecords += s.records;
        }
        recoveredTornBytes = torn;
        if (torn > 0) {
            LOG.log(System.Logger.Level.WARNING, "journal " + dir + ": skipped " + torn
                    + " bytes of torn or damaged records left by an interrupted write");
        }
        if (segments.isEmpty()) {
            startSegment(1);
        } else {
            openWriter(segments.getLast());
        }
    }

    /** Scans a segment, truncating it after its last whole record; returns the bytes cut off. */
    private static long recover(Segment s) throws IOException {
        try (FileChannel ch = FileChannel.open(s.path, StandardOpenOption.READ, StandardOpenOption.WRITE)) {
            long size = ch.size();
            long pos = 0;
            ByteBuffer header = ByteBuffer.allocate(HEADER_BYTES);
            CRC32C crc = new CRC32C();
            while (pos + HEADER_BYTES <= size) {
                header.clear();
                readFully(ch, header, pos);
                int len = header.getInt(0);
                int sum = header.getInt(4);
                if (len <= 0 || len > MAX_RECORD_BYTES || pos + HEADER_BYTES + len > size) {
                    break;
                }
                ByteBuffer payload = ByteBuffer.allocate(len);
                readFully(ch, payload, pos + HEADER_BYTES);
                crc.reset();
                crc.update(payload.array());
                if ((int) crc.getValue() != sum) {
                    break;
                }
                pos += HEADER_BYTES + len;
                s.records++;
            }
            if (pos < size) {
                ch.truncate(pos);
                ch.force(true);
            }
            s.bytes = pos;
            return size - pos;
        }
    }

    private static void readFully(FileChannel ch, ByteBuffer buf, long pos) throws IOException {
        while (buf.hasRemaining()) {
            int n = ch.read(buf, pos + buf.position());
            if (n < 0) {
                throw new IOException("unexpected end of journal segment");
            }
        }
    }

    private void startSegment(long number) throws IOException {
        Segment s = new Segment(number, dir.resolve(String.format("%s%020d%s", PREFIX, number, SUFFIX)));
        Files.newByteChannel(s.path, StandardOpenOption.CREATE_NEW, StandardOpenOption.WRITE).close();
        segments.addLast(s);
        openWriter(s);
    }

    private void openWriter(Segment s) throws IOException {
        if (writer != null) {
            writer.force(false);
            writer.close();
        }
        writer = FileChannel.open(s.path, StandardOpenOption.WRITE, StandardOpenOption.APPEND);
        dirty = false;
    }

    /** Bytes of torn or damaged records cut off when the journal was opened. */
    synchronized long recoveredTornBytes() {
        return recoveredTornBytes;
    }

    /**
     * Appends records in order.
     *
     * @return the number of records dropped, oldest first, to keep the journal within its bound
     */
    synchronized long append(List<byte[]> payloads) throws IOException {
        if (payloads.isEmpty()) {
            return 0;
        }
        Segment last = segments.getLast();
        int size = 0;
        for (byte[] p : payloads) {
            size += HEADER_BYTES + p.length;
        }
        ByteBuffer buf = ByteBuffer.allocate(size);
        CRC32C crc = new CRC32C();
        for (byte[] p : payloads) {
            if (p.length == 0 || p.length > MAX_RECORD_BYTES) {
                throw new IllegalArgumentException("journal record of " + p.length + " bytes; expected 1 to "
                        + MAX_RECORD_BYTES);
            }
            crc.reset();
            crc.update(p);
            buf.putInt(p.length).putInt((int) crc.getValue()).put(p);
        }
        buf.flip();
        while (buf.hasRemaining()) {
            writer.write(buf);
        }
        dirty = true;
        last.bytes += size;
        last.records += payloads.size();
        totalBytes += size;
        pendingRecords += payloads.size();
        if (last.bytes >= segmentBytes) {
            startSegment(last.number + 1);
        }
        long dropped = 0;
        while (totalBytes > maxBytes && segments.size() > 1) {
            dropped += dropOldest();
        }
        return dropped;
    }

    private long dropOldest() throws IOException {
        Segment s = segments.removeFirst();
        long lost = s.records - readRecordsInSegment;
        closeReader(s);
        Files.deleteIfExists(s.path);
        totalBytes -= s.bytes;
        pendingRecords -= lost;
        readOffset = 0;
        readRecordsInSegment = 0;
        peeked = 0;
        return lost;
    }

    /**
     * Up to {@code max} records from the read position, in append order, without consuming them.
     * A later {@link #acknowledge} consumes them.
     */
    synchronized List<byte[]> peek(int max) throws IOException {
        List<byte[]> out = new ArrayList<>(Math.min(max, 1024));
        Segment s = segments.getFirst();
        long pos = readOffset;
        int index = readRecordsInSegment;
        // Many records per read: the lock is held meanwhile, and two reads per record (header, then
        // payload) kept the threads that append waiting behind a thousand system calls a batch.
        ByteBuffer buf = ByteBuffer.allocate(0);
        while (out.size() < max && index < s.records) {
            if (s.reader == null) {
                s.reader = FileChannel.open(s.path, StandardOpenOption.READ);
            }
            int need = buf.remaining() >= HEADER_BYTES ? HEADER_BYTES + buf.getInt(buf.position()) : HEADER_BYTES;
            if (buf.remaining() < need) {
                long left = s.bytes - pos;
                if (left < need) {
                    throw new IOException("journal segment " + s.path + ": the record at byte " + pos + " needs "
                            + need + " bytes, " + left + " are left");
                }
                buf = ByteBuffer.allocate((int) Math.min(left, Math.max(PEEK_CHUNK_BYTES, need)));
                readFully(s.reader, buf, pos);
                buf.flip();
                continue;
            }
            buf.position(buf.position() + HEADER_BYTES);
            byte[] payload = new byte[need - HEADER_BYTES];
            buf.get(payload);
            out.add(payload);
            pos += need;
            index++;
        }
        peeked = out.size();
        peekedEnd = pos;
        return out;
    }

    /** Consumes the records of the last {@link #peek}, deleting the segment when it is used up. */
    synchronized void acknowledge() throws IOException {
        if (peeked == 0) {
            return;
        }
        Segment s = segments.getFirst();
        readOffset = peekedEnd;
        readRecordsInSegment += peeked;
        pendingRecords -= peeked;
        peeked = 0;
        if (readRecordsInSegment == s.records && segments.size() > 1) {
            segments.removeFirst();
            closeReader(s);
            Files.deleteIfExists(s.path);
            totalBytes -= s.bytes;
            readOffset = 0;
            readRecordsInSegment = 0;
        } else if (readRecordsInSegment == s.records) {
            // The only segment is also the one being appended to: empty it in place.
            closeReader(s);
            writer.truncate(0);
            totalBytes -= s.bytes;
            s.bytes = 0;
            s.records = 0;
            readOffset = 0;
            readRecordsInSegment = 0;
        }
    }

    private static void closeReader(Segment s) throws IOException {
        if (s.reader != null) {
            s.reader.close();
            s.reader = null;
        }
    }

    /**
     * Forces appended bytes to the storage device, when there are any since the last call. The force
     * runs outside the journal's lock: on a busy disk it can take a second, and appends (from the
     * threads that produce results, when the store is behind) and the writer's reads must not wait
     * for it. Bytes appended meanwhile are forced by the next call.
     */
    void sync() throws IOException {
        FileChannel channel;
        synchronized (this) {
            if (!dirty) {
                return;
            }
            channel = writer;
            dirty = false;
        }
        try {
            channel.force(false);
        } catch (java.nio.channels.ClosedByInterruptException e) {
            // Not a segment roll: this thread was interrupted, and the bytes are not known to be forced.
            synchronized (this) {
                dirty = true;
            }
            throw e;
        } catch (java.nio.channels.ClosedChannelException e) {
            // The appends moved on to a new segment meanwhile, which forced this one before closing it.
        } catch (IOException e) {
            synchronized (this) {
                dirty = true;
            }
            throw e;
        }
    }

    /** Records appended and not yet acknowledged. */
    synchronized long pendingRecords() {
        return pendingRecords;
    }

    synchronized boolean isEmpty() {
        return pendingRecords == 0;
    }

    /** Total size of the segment files, bytes. */
    synchronized long bytes() {
        return totalBytes;
    }

    @Override
    public synchronized void close() throws IOException {
        sync(); // under the lock here: nothing may append while the journal closes
        writer.close();
        for (Segment s : segments) {
            closeReader(s);
        }
    }
}
