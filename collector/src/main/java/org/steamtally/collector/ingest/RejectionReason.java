package org.steamtally.collector.ingest;

import java.util.Locale;
import org.steamtally.collector.payload.RejectReason;

/**
 * Why a message or reading did not enter a snapshot; the {@code reason} tag of
 * {@code steamtally.readings.rejected}. The payload's own faults keep the parser's names
 * ({@link RejectReason}); the rest are found by the pipeline.
 */
public enum RejectionReason {
    // The parser's reasons, one for one.
    EMPTY, TOO_LARGE, NOT_JSON, NOT_A_READING, MISSING_VALUE, NOT_NUMERIC, NOT_FINITE, BAD_TIMESTAMP, BAD_UNIT,
    BAD_QUALITY,
    /** The reading says its own quality is bad. */
    QUALITY_BAD,
    /** A unit spelling that no table knows. */
    UNKNOWN_UNIT,
    /** A known unit of another quantity than the sensor measures, e.g. {@code Cel} for a pressure. */
    UNIT_MISMATCH,
    /** Outside the sensor's plausible range after conversion to SI. */
    OUT_OF_RANGE,
    /** Stamped further ahead of the collector's clock than the allowed skew. */
    TOO_FAR_FUTURE,
    /** Stamped further behind the collector's clock than the allowed age. */
    TOO_OLD,
    /** A topic that no sensor has. */
    UNMAPPED_TOPIC,
    /** The queue behind the MQTT client was full; the message was dropped unread. */
    QUEUE_FULL,
    /** A redelivery: same sensor, instant and value as a reading already held (QoS 1 repeats). */
    DUPLICATE,
    /** Older than a reading already held for every snapshot it could still enter. */
    SUPERSEDED,
    /** Same sensor and instant as a reading already held, another value; the first is kept. */
    CONFLICT;

    private final String tag = name().toLowerCase(Locale.ROOT);

    /** The metric tag value, e.g. {@code out_of_range}. */
    public String tag() {
        return tag;
    }

    /** True for a fault of the data or its publisher, as opposed to the normal repeats of QoS 1. */
    public boolean isFault() {
        return this != DUPLICATE && this != SUPERSEDED;
    }

    /** The pipeline's name for a parser's reason. */
    public static RejectionReason of(RejectReason parserReason) {
        return valueOf(parserReason.name());
    }
}
