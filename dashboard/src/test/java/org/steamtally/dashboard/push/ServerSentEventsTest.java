package org.steamtally.dashboard.push;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import org.junit.jupiter.api.Test;

class ServerSentEventsTest {

    @Test
    void eachLineOfTheDataGetsItsOwnDataFieldAndTheEventEndsWithABlankLine() {
        // WHATWG HTML, 9.2.6 "Interpreting an event stream": data lines are joined with LF by the client.
        assertEquals("event: result\ndata: {\"a\":1}\n\n", ServerSentEvents.event("result", "{\"a\":1}"));
        assertEquals("event: alarm\ndata: one\ndata: two\n\n", ServerSentEvents.event("alarm", "one\r\ntwo"));
    }

    @Test
    void aCommentCannotEndTheEventEarly() {
        assertEquals(": a b\n\n", ServerSentEvents.comment("a\nb"));
    }

    @Test
    void anEventNameThatCouldInjectFieldsIsRefused() {
        assertThrows(IllegalArgumentException.class, () -> ServerSentEvents.event("x\ndata: y", "z"));
    }
}
