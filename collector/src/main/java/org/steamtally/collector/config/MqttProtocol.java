package org.steamtally.collector.config;

import java.util.Optional;

/** The MQTT protocol level the collector speaks to its broker. */
public enum MqttProtocol {
    /** MQTT 5.0 (OASIS Standard, 2019): session expiry, shared subscriptions, reason codes. The default. */
    MQTT_5("5"),
    /** MQTT 3.1.1 (OASIS Standard, 2014), for brokers without MQTT 5. */
    MQTT_3_1_1("3.1.1");

    private final String label;

    MqttProtocol(String label) {
        this.label = label;
    }

    /** The spelling used in the plant description, {@code "5"} or {@code "3.1.1"}. */
    public String label() {
        return label;
    }

    /** The protocol a plant-description spelling names; empty for any other spelling. */
    public static Optional<MqttProtocol> fromLabel(String text) {
        for (MqttProtocol p : values()) {
            if (p.label.equals(text)) {
                return Optional.of(p);
            }
        }
        return Optional.empty();
    }
}
