package org.steamtally.dashboard.json;

import java.io.Closeable;
import java.io.Flushable;
import java.io.IOException;
import java.io.Writer;
import java.util.Objects;
import org.steamtally.calc.cycle.UnitResult;

/** Writes result records as JSON Lines: one {@link ResultJson} object per line, each ended by {@code \n}. */
public final class ResultJsonLinesWriter implements Closeable, Flushable {

    private final Writer out;

    /** @param out where the lines go; closed by {@link #close()} */
    public ResultJsonLinesWriter(Writer out) {
        this.out = Objects.requireNonNull(out, "out");
    }

    /**
     * Writes one record and its line end.
     *
     * @throws IllegalArgumentException if a present value is NaN or infinite; nothing is written then
     */
    public void write(UnitResult result) throws IOException {
        // Formatted whole before writing, so that a bad value leaves no half line behind.
        out.write(ResultJson.write(result));
        out.write('\n');
    }

    @Override
    public void flush() throws IOException {
        out.flush();
    }

    @Override
    public void close() throws IOException {
        out.close();
    }
}
