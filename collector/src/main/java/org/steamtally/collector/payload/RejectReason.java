package org.steamtally.collector.payload;

/** Why a payload was not accepted. */
public enum RejectReason {
    /** No bytes, only whitespace, or an empty array. */
    EMPTY,
    /** Longer than the parser's byte limit, more readings than its limit, or a number too long to read. */
    TOO_LARGE,
    /** Not well-formed JSON (including invalid UTF-8, trailing content and duplicate field names). */
    NOT_JSON,
    /** Well-formed JSON but none of the accepted shapes, e.g. an array element that is not an object. */
    NOT_A_READING,
    /** An object without a {@code value} field, or with {@code value: null}. */
    MISSING_VALUE,
    /** The value, or a bare payload, is a string, boolean, object or array rather than a number. */
    NOT_NUMERIC,
    /** The value is NaN or infinite, or too large in magnitude for a double. */
    NOT_FINITE,
    /** {@code ts} is neither whole epoch milliseconds nor an ISO-8601 instant with an offset, or lies outside the accepted years. */
    BAD_TIMESTAMP,
    /** {@code unit} is not a non-blank string of at most {@link PayloadParser#MAX_UNIT_CHARS} characters. */
    BAD_UNIT,
    /** {@code quality} is not one of {@code good}, {@code bad}, {@code uncertain}. */
    BAD_QUALITY
}
