package org.steamtally.deploy;

import java.io.IOException;
import java.io.InputStream;
import java.io.UncheckedIOException;
import java.util.Properties;
import picocli.CommandLine.IVersionProvider;

/**
 * The text of {@code steamtally --version}: the project version, written into
 * {@code version.properties} by the build, and the Java runtime it runs on.
 */
public final class VersionProvider implements IVersionProvider {

    private static final String RESOURCE = "version.properties";

    @Override
    public String[] getVersion() {
        return new String[] {
                "steamtally " + projectVersion(),
                "Java " + Runtime.version() + " (" + System.getProperty("java.vendor") + ")"};
    }

    /** The Maven project version the jar was built from, e.g. {@code 0.1.0-SNAPSHOT}. */
    public static String projectVersion() {
        try (InputStream in = VersionProvider.class.getResourceAsStream(RESOURCE)) {
            if (in == null) {
                throw new IllegalStateException(RESOURCE + " is missing from the build");
            }
            Properties properties = new Properties();
            properties.load(in);
            return properties.getProperty("version");
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }
}
