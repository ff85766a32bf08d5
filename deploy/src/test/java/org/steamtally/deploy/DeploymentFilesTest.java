package org.steamtally.deploy;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.TreeSet;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

import org.junit.jupiter.api.Test;
import org.yaml.snakeyaml.LoaderOptions;
import org.yaml.snakeyaml.Yaml;
import org.yaml.snakeyaml.constructor.SafeConstructor;

/**
 * The deployment files (systemd unit, Dockerfile, compose file, Mosquitto configuration) cannot be
 * run here, so they are checked for what can rot silently: every file they name exists, the jar
 * they start is the one the build makes, the three ways of starting the daemon pass it the same
 * arguments, the unit keeps its hardening, every STEAMTALLY_* variable they use is documented
 * in docs/OPERATIONS.md, and every one they or that page name is one the daemon reads.
 */
class DeploymentFilesTest {

    private static final Pattern ENV_NAME = Pattern.compile("\\bSTEAMTALLY_[A-Z0-9_]+\\b");

    /** The repository root, whether the tests run from it or from the deploy module. */
    private static Path root() {
        return Files.exists(Path.of("deploy", "pom.xml")) ? Path.of(".") : Path.of("..");
    }

    private static Path docker() {
        return root().resolve("deploy/docker");
    }

    private static String read(Path p) throws IOException {
        return Files.readString(p);
    }

    @SuppressWarnings("unchecked")
    private static Map<String, Object> compose() throws IOException {
        return (Map<String, Object>) new Yaml(new SafeConstructor(new LoaderOptions()))
                .load(read(docker().resolve("docker-compose.yml")));
    }

    @SuppressWarnings("unchecked")
    private static Map<String, Object> service(String name) throws IOException {
        return (Map<String, Object>) ((Map<String, Object>) compose().get("services")).get(name);
    }

    /** The systemd unit as key → values (a key may repeat), comments and section headers dropped. */
    private static Map<String, List<String>> unit() throws IOException {
        Map<String, List<String>> keys = new LinkedHashMap<>();
        for (String line : read(root().resolve("deploy/systemd/steamtally.service")).split("\\R")) {
            String t = line.strip();
            if (t.isEmpty() || t.startsWith("#") || t.startsWith("[")) {
                continue;
            }
            int eq = t.indexOf('=');
            keys.computeIfAbsent(t.substring(0, eq), k -> new ArrayList<>()).add(t.substring(eq + 1));
        }
        return keys;
    }

    /** The JSON-array form of a Dockerfile instruction, e.g. ENTRYPOINT ["java", ...]. */
    private static List<String> execForm(String dockerfile, String instruction) {
        Matcher m = Pattern.compile("(?m)^" + instruction + " \\[(.*)]$").matcher(dockerfile);
        assertTrue(m.find(), instruction + " in exec form");
        List<String> words = new ArrayList<>();
        Matcher w = Pattern.compile("\"([^\"]*)\"").matcher(m.group(1));
        while (w.find()) {
            words.add(w.group(1));
        }
        return words;
    }

    @Test
    void composeFileParsesAndHasTheBrokerTheStoreAndTheDaemon() throws Exception {
        @SuppressWarnings("unchecked")
        Map<String, Object> services = (Map<String, Object>) compose().get("services");
        assertEquals(Set.of("mosquitto", "influxdb", "steamtally"), services.keySet());
        assertTrue(String.valueOf(service("influxdb").get("image")).startsWith("influxdb:1."), "InfluxDB 1.x");
    }

    @Test
    void everyFileTheComposeFileMountsOrBuildsFromExists() throws Exception {
        String ignored = read(root().resolve(".gitignore"));
        for (String name : List.of("mosquitto", "influxdb", "steamtally")) {
            Object volumes = service(name).get("volumes");
            for (Object v : volumes == null ? List.of() : (List<?>) volumes) {
                String source = v.toString().split(":")[0];
                if (!source.startsWith(".")) {
                    continue; // a named volume
                }
                if (source.startsWith("./secrets/")) {
                    assertTrue(ignored.contains("deploy/docker/secrets/"), "operator-made secrets are kept out of git");
                    continue;
                }
                assertTrue(Files.isRegularFile(docker().resolve(source)), name + " mounts " + source);
            }
        }
        @SuppressWarnings("unchecked")
        Map<String, Object> build = (Map<String, Object>) service("steamtally").get("build");
        Path context = docker().resolve(build.get("context").toString());
        assertTrue(Files.isRegularFile(context.resolve("pom.xml")), "build context is the repository root");
        assertTrue(Files.isRegularFile(context.resolve(build.get("dockerfile").toString())));
        assertTrue(ignored.contains("deploy/docker/steamtally.env"), "the filled-in secrets file is kept out of git");
        assertTrue(Files.isRegularFile(root().resolve("deploy/systemd/steamtally.env.example")));
    }

    @Test
    void brokerConfigurationAsksForThePasswordFileComposeMounts() throws Exception {
        String conf = read(root().resolve("deploy/mosquitto/steamtally-mosquitto-compose.conf"));
        assertTrue(conf.contains("allow_anonymous false"));
        Matcher m = Pattern.compile("(?m)^password_file (\\S+)$").matcher(conf);
        assertTrue(m.find());
        String file = m.group(1);
        assertTrue(((List<?>) service("mosquitto").get("volumes")).stream()
                .anyMatch(v -> v.toString().split(":")[1].equals(file)), "mounted at " + file);
    }

    @Test
    void dockerfileCopiesOnlyWhatExistsAndBuildsTheJarTheLauncherMakes() throws Exception {
        String dockerfile = read(docker().resolve("Dockerfile"));
        Matcher copy = Pattern.compile("(?m)^COPY (?!--from)(\\S+) ").matcher(dockerfile);
        int copies = 0;
        while (copy.find()) {
            copies++;
            assertTrue(Files.exists(root().resolve(copy.group(1))), "COPY " + copy.group(1));
        }
        assertTrue(copies >= 5, "poms, sources and the example plant are copied");
        String pom = read(root().resolve("deploy/pom.xml"));
        Matcher finalName = Pattern.compile("<finalName>([^<]+)</finalName>").matcher(pom);
        assertTrue(finalName.find());
        assertTrue(dockerfile.contains("deploy/target/" + finalName.group(1) + ".jar"), "the shaded jar's name");
        assertTrue(dockerfile.contains("FROM maven:3.9-eclipse-temurin-17 AS build"));
        assertTrue(dockerfile.contains("FROM eclipse-temurin:17-jre"));
        assertTrue(dockerfile.contains("USER steamtally"), "runs as a non-root user");
    }

    @Test
    void systemdDockerAndComposeStartTheSameJarWithTheSameArguments() throws Exception {
        String dockerfile = read(docker().resolve("Dockerfile"));
        List<String> docker = new ArrayList<>(execForm(dockerfile, "ENTRYPOINT"));
        docker.addAll(execForm(dockerfile, "CMD"));
        List<String> systemd = List.of(unit().get("ExecStart").get(0).split(" "));
        assertEquals("/usr/bin/java", systemd.get(0));
        assertEquals(systemd.subList(1, systemd.size()), docker.subList(1, docker.size()));
        assertEquals(execForm(dockerfile, "CMD"), service("steamtally").get("command"));
        assertTrue(systemd.contains("/opt/steamtally/steamtally.jar"));
        // What the daemon writes is what the unit lets it write.
        String dataDir = systemd.get(systemd.indexOf("--data-dir") + 1);
        assertEquals(List.of(dataDir), unit().get("ReadWritePaths"));
    }

    @Test
    void systemdUnitKeepsItsHardening() throws Exception {
        Map<String, List<String>> unit = unit();
        Map<String, String> expected = Map.ofEntries(
                Map.entry("User", "steamtally"),
                Map.entry("ProtectSystem", "strict"),
                Map.entry("ProtectHome", "true"),
                Map.entry("PrivateTmp", "true"),
                Map.entry("NoNewPrivileges", "true"),
                Map.entry("CapabilityBoundingSet", ""),
                Map.entry("Restart", "on-failure"),
                Map.entry("EnvironmentFile", "/etc/steamtally/steamtally.env"));
        expected.forEach((k, v) -> assertEquals(List.of(v), unit.get(k), k));
        assertTrue(unit.containsKey("MemoryMax") && unit.containsKey("RestrictAddressFamilies")
                && unit.containsKey("StartLimitBurst") && unit.containsKey("TimeoutStopSec"));
        assertTrue(Integer.parseInt(unit.get("TimeoutStopSec").get(0)) >= 30, "time for the flush on SIGTERM");
    }

    @Test
    void everyEnvironmentVariableTheDeploymentFilesUseIsDocumented() throws Exception {
        Set<String> used = new TreeSet<>();
        for (String file : List.of("deploy/systemd/steamtally.env.example", "deploy/systemd/steamtally.service",
                "deploy/docker/Dockerfile", "deploy/docker/docker-compose.yml", "deploy/src/main/resources/logback.xml")) {
            Matcher m = ENV_NAME.matcher(read(root().resolve(file)));
            while (m.find()) {
                used.add(m.group());
            }
        }
        String operations = read(root().resolve("docs/OPERATIONS.md"));
        Set<String> missing = new TreeSet<>();
        for (String name : used) {
            if (!operations.contains("`" + name + "`")) {
                missing.add(name);
            }
        }
        assertTrue(missing.isEmpty(), "not in docs/OPERATIONS.md: " + missing);
    }

    @Test
    void healthCheckAsksForARouteTheDashboardServes() throws Exception {
        String dockerfile = read(docker().resolve("Dockerfile"));
        Matcher m = Pattern.compile("http://127\\.0\\.0\\.1:8080(/\\S+)").matcher(dockerfile);
        assertTrue(m.find());
        String server = read(root().resolve(
                "dashboard/src/main/java/org/steamtally/dashboard/http/DashboardServer.java"));
        assertTrue(server.contains("\"" + m.group(1) + "\""), "the dashboard routes " + m.group(1));
    }

    /** The STEAMTALLY_* names in string literals of the main sources, and in the Logback configuration. */
    private static Set<String> variablesTheDaemonReads() throws IOException {
        Set<String> read = new TreeSet<>();
        Pattern literal = Pattern.compile("\"(STEAMTALLY_[A-Z0-9_]+)\"");
        for (String module : List.of("calc", "collector", "dashboard", "deploy")) {
            Path src = root().resolve(module + "/src/main/java");
            if (!Files.isDirectory(src)) {
                continue;
            }
            try (var files = Files.walk(src)) {
                for (Path f : files.filter(p -> p.toString().endsWith(".java")).toList()) {
                    Matcher m = literal.matcher(read(f));
                    while (m.find()) {
                        read.add(m.group(1));
                    }
                }
            }
        }
        Matcher m = Pattern.compile("\\$\\{(STEAMTALLY_[A-Z0-9_]+)").matcher(
                read(root().resolve("deploy/src/main/resources/logback.xml")));
        while (m.find()) {
            read.add(m.group(1));
        }
        return read;
    }

    @Test
    void everyVariableTheDeploymentFilesAndTheOperationsGuideNameIsOneTheDaemonReads() throws Exception {
        Set<String> read = variablesTheDaemonReads();
        assertTrue(read.containsAll(Set.of("STEAMTALLY_USERS_FILE", "STEAMTALLY_INFLUX_URL", "STEAMTALLY_HTTP_HOST",
                "STEAMTALLY_LOG_FORMAT", "STEAMTALLY_LOG_LEVEL")), "the scan finds the daemon's variables: " + read);
        Set<String> promised = new TreeSet<>();
        for (String file : List.of("deploy/systemd/steamtally.env.example", "deploy/systemd/steamtally.service",
                "deploy/docker/Dockerfile", "deploy/docker/docker-compose.yml", "docs/OPERATIONS.md")) {
            Matcher m = ENV_NAME.matcher(read(root().resolve(file)));
            while (m.find()) {
                promised.add(m.group());
            }
        }
        promised.removeAll(read);
        promised.removeIf(name -> name.endsWith("_")); // a family, as in STEAMTALLY_INFLUX_*
        assertTrue(promised.isEmpty(), "named for operators but read by no code: " + promised);
    }

    @Test
    void theComposePlantIsTheRegenerativeExampleWithACollectorWhoseSecretsTheTemplateSets() throws Exception {
        String plant = read(docker().resolve("plant.yaml"));
        assertTrue(plant.contains(read(root().resolve("deploy/examples/regenerative.yaml"))),
                "deploy/docker/plant.yaml holds the regenerative example verbatim");
        var files = org.steamtally.deploy.daemon.DaemonConfigFiles.load(docker().resolve("plant.yaml"));
        assertTrue(files.collector().isPresent(), "run needs the collector section");
        String template = read(root().resolve("deploy/systemd/steamtally.env.example"));
        Matcher env = Pattern.compile("\\{env: ([A-Za-z0-9_]+)}").matcher(plant);
        int names = 0;
        while (env.find()) {
            names++;
            assertTrue(Pattern.compile("(?m)^#?" + env.group(1) + "=").matcher(template).find(),
                    "the env template sets " + env.group(1));
        }
        assertEquals(2, names, "user name and password of the broker account");
    }

    @Test
    void healthCheckIsTheLivenessRouteAndTheImageStartsTheComposePlant() throws Exception {
        String dockerfile = read(docker().resolve("Dockerfile"));
        assertTrue(dockerfile.contains("http://127.0.0.1:8080/health/live"));
        assertTrue(dockerfile.contains("COPY deploy/docker/plant.yaml /etc/steamtally/plant.yaml"));
    }
}
