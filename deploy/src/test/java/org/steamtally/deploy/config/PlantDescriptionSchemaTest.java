package org.steamtally.deploy.config;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.dataformat.yaml.YAMLMapper;
import com.networknt.schema.Error;
import com.networknt.schema.Schema;
import com.networknt.schema.SchemaRegistry;
import com.networknt.schema.SpecificationVersion;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.EnumSource;
import org.junit.jupiter.params.provider.ValueSource;
import org.steamtally.calc.plant.Quantity;
import org.steamtally.collector.units.Units;

/** The shipped JSON Schema (draft 2020-12) accepts the shipped examples and rejects malformed files. */
class PlantDescriptionSchemaTest {

    private static final YAMLMapper YAML = new YAMLMapper();

    private static Path schemaFile() {
        Path fromModule = Path.of("..", "docs", "plant-description.schema.json");
        return Files.exists(fromModule) ? fromModule : Path.of("docs", "plant-description.schema.json");
    }

    private static JsonNode schemaNode() throws IOException {
        return new ObjectMapper().readTree(schemaFile().toFile());
    }

    private static List<Error> validate(String yaml) throws IOException {
        Schema schema = SchemaRegistry.withDefaultDialect(SpecificationVersion.DRAFT_2020_12).getSchema(schemaNode());
        return schema.validate(YAML.readTree(yaml));
    }

    @ParameterizedTest
    @ValueSource(strings = {"simple.yaml", "reheat.yaml", "regenerative.yaml"})
    void shippedExampleSatisfiesTheSchema(String name) throws IOException {
        assertEquals(List.of(), validate(Files.readString(ExamplePlantDescriptionTest.example(name))));
    }

    @ParameterizedTest
    @ValueSource(strings = {"valid-minimal.yaml", "valid-mixing-outlet.yaml"})
    void validTestFileSatisfiesTheSchema(String name) throws Exception {
        Path file = Path.of(getClass().getResource(name).toURI());
        assertEquals(List.of(), validate(Files.readString(file)));
    }

    private static String minimal() throws Exception {
        return Files.readString(Path.of(PlantDescriptionSchemaTest.class.getResource("valid-minimal.yaml").toURI()));
    }

    private static String replaced(String text, String from, String to) {
        if (!text.contains(from)) {
            throw new IllegalArgumentException("test file lacks " + from);
        }
        return text.replace(from, to);
    }

    @ParameterizedTest(name = "{0}")
    @ValueSource(strings = {
        "unknown top-level key|site: {id: testsite,|settings: 1\nsite: {id: testsite,",
        "value without unit|pressure: {value: 2, unit: barg}|pressure: {value: 2}",
        "mass-flow unit on a pressure sensor|{id: PT-2, quantity: pressure, unit: kPa,|{id: PT-2, quantity: pressure, unit: kg/s,",
        "unit in the wrong case|{id: PT-2, quantity: pressure, unit: kPa,|{id: PT-2, quantity: pressure, unit: KPA,",
        "expanded uncertainty without k|uncertainty: 0.05, range: {min: 0, max: 25}}|uncertainty: {value: 0.1, basis: expanded}, range: {min: 0, max: 25}}",
        "unknown component type|type: pump,|type: pmup,",
        "port of another component type|{id: pump, type: pump, inlet: condensate,|{id: pump, type: pump, steam_inlet: x, inlet: condensate,",
        "two fixes for one state|fixed_by: {saturated_liquid: {p: PT-3}}|fixed_by: {saturated_liquid: {p: PT-3}, quality: {p: PT-3, x: 0}}",
        "efficiency in percent|efficiency: {value: 0.98,|efficiency: {value: 98,",
        "gauge atmospheric pressure|atmospheric_pressure: {value: 101.3, unit: kPa}|atmospheric_pressure: {value: 0, unit: barg}",
        "duration without unit|range: {min: 0, max: 20}}|range: {min: 0, max: 20}, max_age: 5}",
    })
    void malformedFileIsRejectedByTheSchema(String testCase) throws Exception {
        String[] parts = testCase.split("\\|");
        List<Error> errors = validate(replaced(minimal(), parts[1], parts[2]));
        assertFalse(errors.isEmpty(), parts[0]);
    }

    @ParameterizedTest
    @EnumSource(Quantity.class)
    void schemaUnitListsAreExactlyTheSpellingsTheUnitsPackageAccepts(Quantity quantity) throws IOException {
        JsonNode defs = schemaNode().get("$defs");
        String def = switch (quantity) {
            case PRESSURE -> "pressure_unit";
            case TEMPERATURE -> "temperature_unit";
            case MASS_FLOW -> "mass_flow_unit";
            case POWER, ENERGY_RATE -> "power_unit";
            case SPECIFIC_ENERGY -> "specific_energy_unit";
        };
        List<String> inSchema = new ArrayList<>();
        defs.get(def).get("enum").forEach(n -> inSchema.add(n.asText()));
        List<String> accepted = new ArrayList<>(Units.spellingsOf(quantity));
        inSchema.sort(null);
        accepted.sort(null);
        assertEquals(accepted, inSchema);
    }
}
