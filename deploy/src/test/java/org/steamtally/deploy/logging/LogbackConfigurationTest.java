package org.steamtally.deploy.logging;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.net.URL;
import java.nio.charset.StandardCharsets;
import java.util.List;
import java.util.Map;

import ch.qos.logback.classic.LoggerContext;
import ch.qos.logback.classic.joran.JoranConfigurator;
import ch.qos.logback.classic.util.LogbackMDCAdapter;
import ch.qos.logback.core.status.Status;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import org.junit.jupiter.api.Test;
import org.slf4j.Logger;

/**
 * The shipped logback.xml: plain lines by default, one JSON object per line on request, third-party
 * libraries held at WARN, and no status chatter from Logback itself when the configuration is good.
 * Each test configures a context of its own from the resource, with the format given as a context
 * property (Logback looks variables up in the context before system properties and the environment).
 */
class LogbackConfigurationTest {

    private record Run(String err, List<Status> statuses) {
    }

    private static Run logWith(Map<String, String> properties) throws Exception {
        URL config = LogbackConfigurationTest.class.getResource("/logback.xml");
        PrintStream original = System.err;
        ByteArrayOutputStream captured = new ByteArrayOutputStream();
        LoggerContext context = new LoggerContext();
        // A context made by hand has no MDC adapter; the one SLF4J starts with has.
        context.setMDCAdapter(new LogbackMDCAdapter());
        try {
            System.setErr(new PrintStream(captured, true, StandardCharsets.UTF_8));
            properties.forEach(context::putProperty);
            JoranConfigurator configurator = new JoranConfigurator();
            configurator.setContext(context);
            configurator.doConfigure(config);
            Logger own = context.getLogger("org.steamtally.collector.Probe");
            own.info("accepted {} readings from {}", 33, "unit3");
            own.debug("not shown at the default level");
            context.getLogger("io.netty.channel.Probe").info("library start-up detail");
            context.getLogger("io.vertx.core.Probe").warn("library warning");
        } finally {
            context.stop();
            System.setErr(original);
        }
        return new Run(captured.toString(StandardCharsets.UTF_8), context.getStatusManager().getCopyOfStatusList());
    }

    private static int worstLevel(List<Status> statuses) {
        return statuses.stream().mapToInt(Status::getLevel).max().orElse(Status.INFO);
    }

    @Test
    void plainFormatIsTheDefaultOneLinePerEventWithUtcTime() throws Exception {
        Run run = logWith(Map.of());
        String[] lines = run.err().strip().split("\\R");
        assertEquals(2, lines.length, run.err() + run.statuses());
        assertTrue(lines[0].matches("\\d{4}-\\d\\d-\\d\\dT\\d\\d:\\d\\d:\\d\\d\\.\\d{3}Z INFO  \\[.+] Probe: "
                + "accepted 33 readings from unit3"), lines[0]);
        assertTrue(lines[1].contains("WARN") && lines[1].endsWith("library warning"), lines[1]);
        assertEquals(Status.INFO, worstLevel(run.statuses()), "Logback would print its status: " + run.statuses());
    }

    @Test
    void jsonFormatWritesOneParsableObjectPerEvent() throws Exception {
        Run run = logWith(Map.of("steamtally.log.format", "json"));
        String[] lines = run.err().strip().split("\\R");
        assertEquals(2, lines.length, run.err() + run.statuses());
        JsonNode first = new ObjectMapper().readTree(lines[0]);
        assertEquals("INFO", first.get("level").asText());
        assertEquals("org.steamtally.collector.Probe", first.get("loggerName").asText());
        assertEquals("accepted 33 readings from unit3", first.get("formattedMessage").asText());
        assertTrue(first.get("timestamp").isNumber());
        assertEquals("WARN", new ObjectMapper().readTree(lines[1]).get("level").asText());
        assertEquals(Status.INFO, worstLevel(run.statuses()), "Logback would print its status: " + run.statuses());
    }

    @Test
    void ownLoggersFollowTheConfiguredLevelWhileLibrariesStayAtWarn() throws Exception {
        Run run = logWith(Map.of("steamtally.log.level", "DEBUG"));
        assertTrue(run.err().contains("not shown at the default level"), run.err());
        assertFalse(run.err().contains("library start-up detail"), run.err());
    }

    @Test
    void anUnknownFormatIsReportedByLogbackRatherThanIgnored() throws Exception {
        Run run = logWith(Map.of("steamtally.log.format", "xml"));
        assertEquals(Status.WARN, worstLevel(run.statuses()));
        assertTrue(run.statuses().stream().anyMatch(s -> s.getMessage().contains("steamtally-logback-xml.xml")),
                run.statuses().toString());
    }
}
