package org.steamtally.collector.ingest;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.slf4j.Marker;
import org.slf4j.event.Level;
import org.slf4j.helpers.AbstractLogger;

class RateLimitedLogTest {

    /** Keeps the WARN lines written to it. */
    private static final class Lines extends AbstractLogger {
        private static final long serialVersionUID = 1L;
        final List<String> lines = new ArrayList<>();

        @Override
        protected String getFullyQualifiedCallerName() {
            return null;
        }

        @Override
        protected void handleNormalizedLoggingCall(Level level, Marker marker, String pattern, Object[] args,
                                                   Throwable t) {
            lines.add(pattern);
        }

        @Override
        public boolean isTraceEnabled() {
            return false;
        }

        @Override
        public boolean isTraceEnabled(Marker marker) {
            return false;
        }

        @Override
        public boolean isDebugEnabled() {
            return false;
        }

        @Override
        public boolean isDebugEnabled(Marker marker) {
            return false;
        }

        @Override
        public boolean isInfoEnabled() {
            return false;
        }

        @Override
        public boolean isInfoEnabled(Marker marker) {
            return false;
        }

        @Override
        public boolean isWarnEnabled() {
            return true;
        }

        @Override
        public boolean isWarnEnabled(Marker marker) {
            return true;
        }

        @Override
        public boolean isErrorEnabled() {
            return true;
        }

        @Override
        public boolean isErrorEnabled(Marker marker) {
            return true;
        }
    }

    @Test
    void oneLinePerKeyPerIntervalWithTheCountHeldBack() {
        Lines logger = new Lines();
        MutableClock clock = new MutableClock(Instant.parse("2026-12-01T00:00:00Z"));
        RateLimitedLog log = new RateLimitedLog(logger, clock, 10_000);
        for (int i = 0; i < 100; i++) {
            log.warn("PT-101/out_of_range", () -> "refused out_of_range on topic fernholm/unit1/PT-101: 31.0 MPa");
        }
        log.warn("TT-101/quality_bad", () -> "refused quality_bad on topic fernholm/unit1/TT-101: 540.0");
        clock.advance(Duration.ofSeconds(10));
        log.warn("PT-101/out_of_range", () -> "refused out_of_range on topic fernholm/unit1/PT-101: 32.0 MPa");
        assertEquals(List.of(
                "refused out_of_range on topic fernholm/unit1/PT-101: 31.0 MPa",
                "refused quality_bad on topic fernholm/unit1/TT-101: 540.0",
                "refused out_of_range on topic fernholm/unit1/PT-101: 32.0 MPa (99 more like it held back)"),
                logger.lines);
    }
}
