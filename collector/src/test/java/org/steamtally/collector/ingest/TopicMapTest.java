package org.steamtally.collector.ingest;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.Optional;
import org.junit.jupiter.api.Test;

class TopicMapTest {

    @Test
    void templateGivesEachSensorWithoutOwnTopicItsSiteUnitAndSensorPath() {
        TopicMap map = TestPlant.topics();
        assertEquals("PT-101", map.targets("fernholm/unit1/PT-101").get(0).sensor().id());
        assertEquals(0, map.targets("fernholm/unit1/PT-101").get(0).unitIndex());
        assertEquals(Optional.of("fernholm/unit1/TT-101"), map.topicOf("TT-101"));
    }

    @Test
    void sensorsOwnTopicWinsOverTheTemplateAndIsSubscribedBesideTheWildcard() {
        TopicMap map = TestPlant.topics();
        assertEquals("PT-201", map.targets("legacy/fernholm/u2/pressure").get(0).sensor().id());
        assertTrue(map.targets("fernholm/unit2/PT-201").isEmpty());
        assertEquals(List.of("fernholm/+/+", "legacy/fernholm/u2/pressure"), map.subscriptionFilters());
    }

    @Test
    void topicOfNoSensorHasNoTargets() {
        assertTrue(TestPlant.topics().targets("fernholm/unit1/XX-999").isEmpty());
    }

    @Test
    void filterMatchingFollowsTheMqttWildcardRules() {
        // MQTT 5.0, 4.7.1: "sport/#" matches "sport" too; "+" matches exactly one level, empty included.
        assertTrue(TopicMap.matches("a/+/c", "a/b/c"));
        assertTrue(TopicMap.matches("a/+/c", "a//c"));
        assertFalse(TopicMap.matches("a/+/c", "a/b/c/d"));
        assertTrue(TopicMap.matches("sport/#", "sport"));
        assertTrue(TopicMap.matches("sport/#", "sport/tennis/player1"));
        assertFalse(TopicMap.matches("a/b", "a/b/c"));
    }

    @Test
    void templateWithoutSensorPlaceholderIsRefused() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> TopicMap.of(TestPlant.PLANT, Optional.of("{site}/{unit}")));
        assertTrue(e.getMessage().contains("{sensor}"), e.getMessage());
    }

    @Test
    void templateWithUnknownPlaceholderOrWildcardIsRefused() {
        assertThrows(IllegalArgumentException.class,
                () -> TopicMap.of(TestPlant.PLANT, Optional.of("{site}/{tag}/{sensor}")));
        assertThrows(IllegalArgumentException.class,
                () -> TopicMap.of(TestPlant.PLANT, Optional.of("{site}/#/{sensor}")));
    }

    @Test
    void sensorWithoutTopicAndNoTemplateIsNamed() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> TopicMap.of(TestPlant.PLANT, Optional.empty()));
        assertTrue(e.getMessage().contains("unit1/PT-101"), e.getMessage());
    }
}
