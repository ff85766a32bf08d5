package org.steamtally.deploy.daemon;

import java.nio.file.Path;
import org.steamtally.calc.alarm.AlarmSettings;
import org.steamtally.calc.plant.PlantDescription;
import org.steamtally.collector.config.CollectorSettings;
import org.steamtally.deploy.config.AlarmSettingsLoader;
import org.steamtally.deploy.config.CollectorSectionReader;
import org.steamtally.deploy.config.PlantDescriptionException;
import org.steamtally.deploy.config.PlantDescriptionLoader;
import org.steamtally.deploy.config.WindowChannelSettings;

/**
 * The three sections of a daemon's configuration file, read together: the plant description, its
 * {@code alarms} section (with its {@code window} subsection) and its {@code collector} section.
 *
 * @param collector empty when the file has no collector section
 * @param window    the window channel's settings, {@code alarms.window}
 */
public record DaemonConfigFiles(PlantDescription plant, AlarmSettings alarms,
                                java.util.Optional<CollectorSettings> collector, WindowChannelSettings window) {

    public DaemonConfigFiles {
        java.util.Objects.requireNonNull(window, "window");
    }

    /** The sections without a window subsection: the window channel at its defaults. */
    public DaemonConfigFiles(PlantDescription plant, AlarmSettings alarms,
                             java.util.Optional<CollectorSettings> collector) {
        this(plant, alarms, collector, WindowChannelSettings.DEFAULTS);
    }

    /** Reads and checks all three; the exception lists every problem with its place in the file. */
    public static DaemonConfigFiles load(Path file) throws PlantDescriptionException {
        PlantDescription plant = PlantDescriptionLoader.load(file);
        AlarmSettings alarms = AlarmSettingsLoader.load(file);
        return new DaemonConfigFiles(plant, alarms, CollectorSectionReader.load(file, plant),
                AlarmSettingsLoader.loadWindow(file));
    }

    /** The same from text, e.g. a shipped example read from the jar. */
    public static DaemonConfigFiles parse(String fileName, String yaml) throws PlantDescriptionException {
        PlantDescription plant = PlantDescriptionLoader.parse(fileName, yaml);
        AlarmSettings alarms = AlarmSettingsLoader.parse(fileName, yaml);
        return new DaemonConfigFiles(plant, alarms, CollectorSectionReader.parse(fileName, yaml,
                java.util.Optional.of(plant)), AlarmSettingsLoader.parseWindow(fileName, yaml));
    }
}
