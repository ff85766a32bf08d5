package org.steamtally.deploy.config;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.net.URISyntaxException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.stream.Collectors;
import java.util.stream.Stream;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;

/**
 * Each file under {@code bad/} marks the problems it must raise with {@code # expect: <message part>}
 * comments on the line the problem is to be reported at. The loader must report exactly those: each
 * at its line, and nothing else, so that follow-on noise shows up as a failure too.
 */
class BadPlantDescriptionTest {

    private record Expectation(int line, String fragment) {
    }

    static Stream<Path> badFiles() throws IOException, URISyntaxException {
        Path dir = Path.of(BadPlantDescriptionTest.class.getResource("bad").toURI());
        try (Stream<Path> files = Files.list(dir)) {
            return files.filter(p -> p.toString().endsWith(".yaml")).sorted().collect(Collectors.toList()).stream();
        }
    }

    private static List<Expectation> expectations(Path file) throws IOException {
        List<String> lines = Files.readAllLines(file, StandardCharsets.UTF_8);
        List<Expectation> expected = new ArrayList<>();
        for (int i = 0; i < lines.size(); i++) {
            String[] parts = lines.get(i).split("# expect: ");
            for (int k = 1; k < parts.length; k++) {
                expected.add(new Expectation(i + 1, parts[k].strip()));
            }
        }
        return expected;
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("badFiles")
    void everyMarkedProblemIsReportedAtItsLineAndNothingElse(Path file) throws IOException {
        List<Expectation> expected = expectations(file);
        assertFalse(expected.isEmpty(), "a bad file marks its problems with # expect:");
        PlantDescriptionException e = assertThrows(PlantDescriptionException.class,
                () -> PlantDescriptionLoader.load(file));
        String report = e.getMessage();
        for (Expectation x : expected) {
            boolean found = e.problems().stream()
                    .anyMatch(p -> p.line() == x.line() && p.message().contains(x.fragment()));
            assertTrue(found, "expected at line " + x.line() + ": " + x.fragment() + "\ngot:\n" + report);
        }
        assertEquals(expected.size(), e.problems().size(), "unexpected further problems:\n" + report);
        for (ConfigProblem p : e.problems()) {
            assertEquals(file.toString(), p.file());
            assertTrue(report.contains(p.toString()), "the message lists every problem");
        }
    }

    @Test
    void messageNamesFileLineAndColumnOfEachProblem() throws Exception {
        Path file = badFiles().filter(p -> p.endsWith("unknown-unit.yaml")).findFirst().orElseThrow();
        PlantDescriptionException e = assertThrows(PlantDescriptionException.class,
                () -> PlantDescriptionLoader.load(file));
        assertTrue(e.getMessage().startsWith("plant description " + file + " has 3 problems:"), e.getMessage());
        assertTrue(e.getMessage().contains(file + ":10:46: unit \"furlong\" is not a pressure unit"), e.getMessage());
    }

    @Test
    void renamedDrainStateInTheRegenerativeExampleIsNamedWithItsPortAndLine() throws Exception {
        Path example = ExamplePlantDescriptionTest.example("regenerative.yaml");
        List<String> lines = Files.readAllLines(example, StandardCharsets.UTF_8);
        int drainLine = -1;
        for (int i = 0; i < lines.size(); i++) {
            if (lines.get(i).strip().equals("drain_outlet: hp_drain")) {
                drainLine = i + 1;
                lines.set(i, lines.get(i).replace("hp_drain", "hp_heater_drain"));
            }
        }
        assertTrue(drainLine > 0, "the example has the HP heater's drain outlet");
        PlantDescriptionException e = assertThrows(PlantDescriptionException.class,
                () -> PlantDescriptionLoader.parse("regenerative.yaml", String.join("\n", lines)));
        String expected = "regenerative.yaml:" + drainLine + ":23: state \"hp_heater_drain\" named by component"
                + " \"hp_heater\" (port drain_outlet) is not declared";
        assertTrue(e.getMessage().contains(expected), e.getMessage());
        // hp_drain now comes out of nothing, and the loader says so too.
        assertTrue(e.getMessage().contains("state \"hp_drain\" leaves no component"), e.getMessage());
    }

    @Test
    void missingFileIsReportedAsOneProblemNamingIt() {
        Path missing = Path.of("no-such-plant.yaml");
        PlantDescriptionException e = assertThrows(PlantDescriptionException.class,
                () -> PlantDescriptionLoader.load(missing));
        assertEquals(1, e.problems().size());
        assertTrue(e.getMessage().contains("no-such-plant.yaml: cannot be read"), e.getMessage());
    }

    @Test
    void emptyFileIsReportedAsSuch() {
        PlantDescriptionException e = assertThrows(PlantDescriptionException.class,
                () -> PlantDescriptionLoader.parse("empty.yaml", "# nothing here\n"));
        assertTrue(e.getMessage().contains("empty.yaml: is empty"), e.getMessage());
    }
}
