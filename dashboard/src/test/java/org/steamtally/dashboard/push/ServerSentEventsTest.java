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
    void everyLineEndTheStandardKnowsSplitsTheDataAndAnEmptyLineStaysALine() {
        // WHATWG HTML, 9.2.5: a line ends with CRLF, a lone LF or a lone CR.
        assertEquals("event: e\ndata: a\ndata: b\ndata: \ndata: c\ndata: \n\n",
                ServerSentEvents.event("e", "a\rb\n\r\nc\n"));
        assertEquals("event: e\ndata: \n\n", ServerSentEvents.event("e", ""));
    }

    @Test
    void anEmptyEventNameIsRefused() {
        assertThrows(IllegalArgumentException.class, () -> ServerSentEvents.event("", "z"));
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
