package org.steamtally.deploy.daemon;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assertions.fail;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.time.Clock;
import java.time.Duration;
import java.util.Comparator;
import java.util.Map;
import java.util.Optional;
import java.util.stream.Stream;
import org.junit.jupiter.api.Assumptions;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.openqa.selenium.By;
import org.openqa.selenium.JavascriptExecutor;
import org.openqa.selenium.OutputType;
import org.openqa.selenium.StaleElementReferenceException;
import org.openqa.selenium.TakesScreenshot;
import org.openqa.selenium.WebDriver;
import org.openqa.selenium.chrome.ChromeDriver;
import org.openqa.selenium.chrome.ChromeDriverService;
import org.openqa.selenium.chrome.ChromeOptions;
import org.openqa.selenium.support.ui.WebDriverWait;

/**
 * The demo's main view in a real headless Chromium (Debian's {@code chromium} and
 * {@code chromium-driver}), once live results show, written to
 * {@code target/screenshots/demo-main.png}: the source of the README's picture
 * (docs/images/demo-main.png, see DEVELOPERS.md). Without the browser the test is skipped, or fails
 * when {@code STEAMTALLY_REQUIRE_SERVICES=1}.
 */
class DemoScreenshotBrowserTest {

    private static final Path CHROMIUM = Path.of("/usr/bin/chromium");
    private static final Path CHROMEDRIVER = Path.of("/usr/bin/chromedriver");
    private static final Path SCREENSHOTS = Path.of("target", "screenshots");
    // Generous for a loaded two-core machine; the wait polls and returns as soon as the page is ready.
    private static final Duration WAIT = Duration.ofSeconds(60);

    @TempDir
    Path dataDir;

    @Test
    void theDemosMainViewShowsLiveFiguresOfTheExampleUnitAndIsSavedAsAScreenshot() throws Exception {
        if (!Files.isExecutable(CHROMIUM) || !Files.isExecutable(CHROMEDRIVER)) {
            String message = "the screenshot needs " + CHROMIUM + " and " + CHROMEDRIVER
                    + " (Debian packages chromium and chromium-driver)";
            if ("1".equals(System.getenv("STEAMTALLY_REQUIRE_SERVICES"))) {
                fail(message + ", and STEAMTALLY_REQUIRE_SERVICES=1");
            }
            Assumptions.abort(message + "; skipped");
        }
        Files.createDirectories(SCREENSHOTS);
        Path profile = Files.createTempDirectory("steamtally-chromium-");
        System.setProperty("webdriver.chrome.driver", CHROMEDRIVER.toString());
        ChromeOptions options = new ChromeOptions();
        options.setBinary(CHROMIUM.toFile());
        options.addArguments("--headless", "--no-sandbox", "--disable-gpu", "--disable-dev-shm-usage",
                "--disable-background-networking", "--disable-component-update", "--disable-sync", "--no-first-run",
                "--user-data-dir=" + profile, "--window-size=1440,1000", "--force-device-scale-factor=1");
        ChromeDriverService service = new ChromeDriverService.Builder().usingDriverExecutable(CHROMEDRIVER.toFile())
                .usingAnyFreePort().build();
        WebDriver driver = null;
        try (Demo demo = Demo.start(0, dataDir, Optional.empty(), Map.of(), Clock.systemUTC())) {
            driver = new ChromeDriver(service, options);
            driver.get(demo.address() + "/");
            WebDriver d = driver;
            WebDriverWait wait = new WebDriverWait(driver, WAIT);
            wait.ignoring(StaleElementReferenceException.class);
            wait.until(x -> d.findElement(By.cssSelector("#metric-eta .value")).getText().endsWith("%")
                    && !d.findElements(By.cssSelector("#ts circle.ts-point")).isEmpty());
            String eta = driver.findElement(By.cssSelector("#metric-eta .value")).getText();
            double percent = Double.parseDouble(eta.replaceAll("[^0-9.]", ""));
            // A reheat-regenerative unit of this size runs at about 38 % to 45 % (common practice); the
            // example's design point gives 41.3 % (docs/SIMULATOR.md).
            assertTrue(percent > 30 && percent < 50, "thermal efficiency shown: " + eta);
            // The example has about twenty flowing states, each a line with a label on the schematic.
            int flows = driver.findElements(By.cssSelector("#schematic line.sch-flow")).size();
            assertTrue(flows >= 15, "flow lines drawn: " + flows);
            assertSchematicLabelsCoverNothing(driver, flows);
            Path shot = ((TakesScreenshot) driver).getScreenshotAs(OutputType.FILE).toPath();
            Files.copy(shot, SCREENSHOTS.resolve("demo-main.png"), StandardCopyOption.REPLACE_EXISTING);
        } finally {
            if (driver != null) {
                driver.quit();
            }
            try (Stream<Path> files = Files.walk(profile)) {
                files.sorted(Comparator.reverseOrder()).forEach(p -> p.toFile().delete());
            }
        }
    }

    /**
     * Asks the browser for the drawn boxes of the schematic's state labels and of the components with
     * their names and duties, and fails when any label covers one of them or another label.
     */
    static void assertSchematicLabelsCoverNothing(WebDriver driver, int expectedLabels) {
        String found = (String) ((JavascriptExecutor) driver).executeScript(LABEL_OVERLAPS);
        int sep = found.indexOf(':');
        assertEquals(expectedLabels, Integer.parseInt(found.substring(0, sep)), "state labels drawn");
        assertEquals("", found.substring(sep + 1), "schematic labels covering something");
    }

    /** Lists each overlap in words, after the number of labels checked. */
    private static final String LABEL_OVERLAPS = "const box = e => e.getBBox();"
            + "const hit = (a, b) => a.x < b.x + b.width && b.x < a.x + a.width && a.y < b.y + b.height && b.y < a.y + a.height;"
            + "const name = e => e.textContent || e.tagName;"
            + "const labels = [...document.querySelectorAll('#schematic g.sch-state-label')];"
            + "const parts = [...document.querySelectorAll('#schematic .sch-box, #schematic .sch-title, #schematic .sch-sub, #schematic .sch-duty')];"
            + "const out = [];"
            + "labels.forEach((l, i) => { const a = box(l.querySelector('rect')), id = l.querySelector('.sch-label-id').textContent;"
            + "  parts.forEach(c => { if (hit(a, box(c))) out.push(id + ' covers ' + name(c)); });"
            + "  labels.slice(i + 1).forEach(m => { if (hit(a, box(m.querySelector('rect')))) out.push(id + ' covers ' + m.querySelector('.sch-label-id').textContent); });"
            + "  const g = l.getBBox(); if (g.width > a.width + 1 || g.height > a.height + 1) out.push(id + ' text runs out of its box'); });"
            + "return labels.length + ':' + out.join('; ');";
}
