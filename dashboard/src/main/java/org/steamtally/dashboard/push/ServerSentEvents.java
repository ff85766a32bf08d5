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
        if (!isName(name)) {
            throw new IllegalArgumentException("event name must be letters, digits or '_', was '" + name + "'");
        }
        StringBuilder b = new StringBuilder(data.length() + name.length() + 16);
        b.append("event: ").append(name).append('\n');
        // By hand rather than with a split on a pattern: a result's JSON is tens of kilobytes on one
        // line, and the pattern's alternation tried at every character took a sixth of a unit's thread.
        int start = 0;
        for (int i = 0; i < data.length(); i++) {
            char c = data.charAt(i);
            if (c == '\r' || c == '\n') {
                b.append("data: ").append(data, start, i).append('\n');
                if (c == '\r' && i + 1 < data.length() && data.charAt(i + 1) == '\n') {
                    i++;
                }
                start = i + 1;
            }
        }
        b.append("data: ").append(data, start, data.length()).append('\n');
        return b.append('\n').toString();
    }

    private static boolean isName(String name) {
        if (name.isEmpty()) {
            return false;
        }
        for (int i = 0; i < name.length(); i++) {
            char c = name.charAt(i);
            if (!(c >= 'A' && c <= 'Z' || c >= 'a' && c <= 'z' || c >= '0' && c <= '9' || c == '_')) {
                return false;
            }
        }
        return true;
    }

    /** A comment line, which clients ignore; keeps idle connections open through proxies. */
    public static String comment(String text) {
        return ": " + text.replaceAll("[\r\n]", " ") + "\n\n";
    }
}
