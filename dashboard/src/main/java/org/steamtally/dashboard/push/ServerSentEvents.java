package org.steamtally.dashboard.push;

/**
 * The text of Server-Sent Events (WHATWG HTML Living Standard, section 9.2 "Server-sent events").
 */
public final class ServerSentEvents {

    private ServerSentEvents() {
    }

    /**
     * One event: {@code event:} line, one {@code data:} line per line of {@code data}, a blank line.
     *
     * @param name the event type, letters, digits and '_' only
     */
    public static String event(String name, String data) {
        if (!name.matches("[A-Za-z0-9_]+")) {
            throw new IllegalArgumentException("event name must be letters, digits or '_', was '" + name + "'");
        }
        StringBuilder b = new StringBuilder(data.length() + name.length() + 16);
        b.append("event: ").append(name).append('\n');
        for (String line : data.split("\r\n|\r|\n", -1)) {
            b.append("data: ").append(line).append('\n');
        }
        return b.append('\n').toString();
    }

    /** A comment line, which clients ignore; keeps idle connections open through proxies. */
    public static String comment(String text) {
        return ": " + text.replaceAll("[\r\n]", " ") + "\n\n";
    }
}
