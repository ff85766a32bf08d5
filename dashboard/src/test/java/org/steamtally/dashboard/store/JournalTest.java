package org.steamtally.dashboard.store;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.ByteBuffer;
import java.nio.channels.FileChannel;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.util.ArrayList;
import java.util.List;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** The on-disk journal: order, recovery from torn and damaged tails, and its size bound. */
class JournalTest {

    private static final long MAX = 64 * 1024;
    private static final long SEGMENT = 4 * 1024;

    @TempDir
    Path dir;

    private static byte[] record(int i) {
        return ("record " + i).getBytes(StandardCharsets.UTF_8);
    }

    private static List<byte[]> records(int from, int to) {
        List<byte[]> out = new ArrayList<>();
        for (int i = from; i < to; i++) {
            out.add(record(i));
        }
        return out;
    }

    private static List<String> readAll(Journal j) throws IOException {
        List<String> out = new ArrayList<>();
        while (!j.isEmpty()) {
            for (byte[] r : j.peek(7)) {
                out.add(new String(r, StandardCharsets.UTF_8));
            }
            j.acknowledge();
        }
        return out;
    }

    private static List<String> names(int from, int to) {
        List<String> out = new ArrayList<>();
        for (int i = from; i < to; i++) {
            out.add("record " + i);
        }
        return out;
    }

    private Path lastSegment() throws IOException {
        try (Stream<Path> s = Files.list(dir)) {
            return s.sorted().reduce((a, b) -> b).orElseThrow();
        }
    }

    @Test
    void recordsComeBackInAppendOrderAcrossSegmentsAndReopening() throws IOException {
        try (Journal j = new Journal(dir, MAX, SEGMENT)) {
            j.append(records(0, 500));
        }
        try (Journal j = new Journal(dir, MAX, SEGMENT)) {
            assertEquals(500, j.pendingRecords());
            assertEquals(names(0, 500), readAll(j));
            assertEquals(0, j.bytes(), "read segments are deleted, the last one emptied");
        }
    }

    @Test
    void recordsLargerThanOneReadAndManySmallOnesAroundThemComeBackWhole() throws IOException {
        // peek reads 256 KiB at a time: a record that straddles a read, and one larger than a read.
        List<byte[]> written = new ArrayList<>();
        java.util.Random random = new java.util.Random(20261202);
        for (int i = 0; i < 3_000; i++) {
            byte[] r = new byte[i == 1_500 ? 700_000 : 1 + random.nextInt(400)];
            random.nextBytes(r);
            written.add(r);
        }
        try (Journal j = new Journal(dir, 64L << 20, 16L << 20)) {
            j.append(written);
            List<byte[]> read = new ArrayList<>();
            while (!j.isEmpty()) {
                read.addAll(j.peek(1_000));
                j.acknowledge();
            }
            assertEquals(written.size(), read.size());
            for (int i = 0; i < written.size(); i++) {
                assertArrayEquals(written.get(i), read.get(i), "record " + i);
            }
        }
    }

    @Test
    void syncsRunningBesideAppendsAcrossSegmentRollsLoseNoRecordAndKeepTheOrder() throws Exception {
        // The force of a sync runs outside the lock, beside appends that roll over to new segments
        // (closing the channel a sync may be forcing): no failure, nothing lost, order kept.
        List<Throwable> failures = java.util.Collections.synchronizedList(new ArrayList<>());
        try (Journal j = new Journal(dir, 16 * MAX, SEGMENT)) {
            java.util.concurrent.atomic.AtomicBoolean appending = new java.util.concurrent.atomic.AtomicBoolean(true);
            Thread syncer = new Thread(() -> {
                while (appending.get()) {
                    try {
                        j.sync();
                    } catch (IOException | RuntimeException e) {
                        failures.add(e);
                    }
                }
            });
            syncer.start();
            for (int i = 0; i < 2_000; i += 10) {
                j.append(records(i, i + 10));
            }
            appending.set(false);
            syncer.join();
        }
        assertEquals(List.of(), failures);
        try (Journal j = new Journal(dir, 16 * MAX, SEGMENT)) {
            assertEquals(names(0, 2_000), readAll(j));
        }
    }

    @Test
    void aTornLastRecordIsSkippedOnOpeningAndAppendsContinueAfterTheLastWholeOne() throws IOException {
        try (Journal j = new Journal(dir, MAX, SEGMENT)) {
            j.append(records(0, 10));
        }
        // A crash in the middle of a write leaves the header and part of the payload.
        Path seg = lastSegment();
        try (FileChannel ch = FileChannel.open(seg, StandardOpenOption.WRITE, StandardOpenOption.APPEND)) {
            byte[] payload = record(10);
            ch.write(ByteBuffer.allocate(Journal.HEADER_BYTES + 3).putInt(payload.length).putInt(12345)
                    .put(payload, 0, 3).flip());
        }
        long sizeBefore = Files.size(seg);
        try (Journal j = new Journal(dir, MAX, SEGMENT)) {
            assertEquals(Journal.HEADER_BYTES + 3, j.recoveredTornBytes());
            assertEquals(sizeBefore - Journal.HEADER_BYTES - 3, Files.size(seg), "tail cut off");
            j.append(records(11, 13));
            assertEquals(names(0, 10).size() + 2, j.pendingRecords());
            List<String> expected = names(0, 10);
            expected.addAll(names(11, 13));
            assertEquals(expected, readAll(j));
        }
    }

    @Test
    void aLastRecordWithABadChecksumIsSkipped() throws IOException {
        try (Journal j = new Journal(dir, MAX, SEGMENT)) {
            j.append(records(0, 5));
        }
        Path seg = lastSegment();
        byte[] bytes = Files.readAllBytes(seg);
        bytes[bytes.length - 1] ^= 0x40;
        Files.write(seg, bytes);
        try (Journal j = new Journal(dir, MAX, SEGMENT)) {
            assertEquals(Journal.HEADER_BYTES + record(4).length, j.recoveredTornBytes());
            assertEquals(names(0, 4), readAll(j));
        }
    }

    @Test
    void aFullJournalDropsItsOldestRecordsAndSaysHowMany() throws IOException {
        try (Journal j = new Journal(dir, 4 * SEGMENT, SEGMENT)) {
            long dropped = 0;
            int n = 2000;
            for (int i = 0; i < n; i += 50) {
                dropped += j.append(records(i, i + 50));
            }
            assertTrue(dropped > 0, "something was dropped");
            assertTrue(j.bytes() <= 4 * SEGMENT, "bound kept: " + j.bytes());
            List<String> left = readAll(j);
            assertEquals(n - dropped, left.size(), "dropped and kept add up");
            assertEquals(names((int) dropped, n), left, "the newest are kept, in order");
        }
    }

    @Test
    void recordsStayUntilAcknowledged() throws IOException {
        try (Journal j = new Journal(dir, MAX, SEGMENT)) {
            j.append(records(0, 3));
            List<byte[]> first = j.peek(2);
            assertEquals(2, first.size());
            List<byte[]> again = j.peek(2);
            assertArrayEquals(first.get(0), again.get(0), "a peek without acknowledgement reads the same records");
            j.acknowledge();
            assertEquals(1, j.pendingRecords());
        }
    }
}
