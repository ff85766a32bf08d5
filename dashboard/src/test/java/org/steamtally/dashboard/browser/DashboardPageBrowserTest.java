package org.steamtally.dashboard.browser;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNotEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assertions.fail;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.time.ZoneId;
import java.time.temporal.ChronoUnit;
import java.util.Map;
import java.util.function.UnaryOperator;
import java.util.Comparator;
import java.util.List;
import java.util.stream.Stream;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.Assumptions;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.MethodOrderer;
import org.junit.jupiter.api.Order;
import org.junit.jupiter.api.Test;
import org.steamtally.calc.cycle.UnitResult;
import org.junit.jupiter.api.TestMethodOrder;
import org.openqa.selenium.By;
import org.openqa.selenium.JavascriptExecutor;
import org.openqa.selenium.NoAlertPresentException;
import org.openqa.selenium.OutputType;
import org.openqa.selenium.StaleElementReferenceException;
import org.openqa.selenium.TakesScreenshot;
import org.openqa.selenium.WebDriver;
import org.openqa.selenium.WebElement;
import org.openqa.selenium.chrome.ChromeDriver;
import org.openqa.selenium.chrome.ChromeDriverService;
import org.openqa.selenium.chrome.ChromeOptions;
import org.openqa.selenium.support.ui.Select;
import org.openqa.selenium.support.ui.WebDriverWait;
import org.steamtally.dashboard.alarm.AlarmView;
import org.steamtally.dashboard.fixture.FernholmTestPlant;
import org.steamtally.dashboard.fixture.StoreHistory;
import org.steamtally.dashboard.store.ShiftCalendar;
import org.steamtally.dashboard.fixture.TestDashboard;

/**
 * The page in a real headless Chromium (Debian's {@code chromium} and {@code chromium-driver}),
 * against a running dashboard with in-memory live sources and a real embedded store holding three
 * days of results up to the present (the page's ranges are relative to the browser's own clock, so
 * the history is placed around it). Screenshots of each view are written to
 * {@code target/screenshots/} for review. Without the browser the test is skipped, or fails when
 * {@code STEAMTALLY_REQUIRE_SERVICES=1}.
 */
@TestMethodOrder(MethodOrderer.OrderAnnotation.class)
class DashboardPageBrowserTest {

    private static final Path CHROMIUM = Path.of("/usr/bin/chromium");
    private static final Path CHROMEDRIVER = Path.of("/usr/bin/chromedriver");
    private static final Path SCREENSHOTS = Path.of("target", "screenshots");
    // Generous for a loaded two-core machine; the waits poll and return as soon as the page is ready.
    private static final Duration WAIT = Duration.ofSeconds(30);

    private static TestDashboard dash;
    private static WebDriver driver;
    private static Path profile;
    private static Path storeDir;
    private static StoreHistory history;

    @BeforeAll
    static void start() throws IOException {
        if (!Files.isExecutable(CHROMIUM) || !Files.isExecutable(CHROMEDRIVER)) {
            String message = "the browser test needs " + CHROMIUM + " and " + CHROMEDRIVER
                    + " (Debian packages chromium and chromium-driver)";
            if ("1".equals(System.getenv("STEAMTALLY_REQUIRE_SERVICES"))) {
                fail(message + ", and STEAMTALLY_REQUIRE_SERVICES=1");
            }
            Assumptions.abort(message + "; skipped");
        }
        Files.createDirectories(SCREENSHOTS);
        profile = Files.createTempDirectory("steamtally-chromium-");
        // The system driver, so that Selenium Manager has nothing to download.
        System.setProperty("webdriver.chrome.driver", CHROMEDRIVER.toString());
        ChromeOptions options = new ChromeOptions();
        options.setBinary(CHROMIUM.toFile());
        options.addArguments("--headless", "--no-sandbox", "--disable-gpu", "--disable-dev-shm-usage",
                "--disable-background-networking", "--disable-component-update", "--disable-sync", "--no-first-run",
                "--user-data-dir=" + profile, "--window-size=1920,1500", "--force-device-scale-factor=1");
        ChromeDriverService service = new ChromeDriverService.Builder().usingDriverExecutable(CHROMEDRIVER.toFile())
                .usingAnyFreePort().build();
        storeDir = Files.createTempDirectory("steamtally-browser-store-");
        Instant now = Instant.now().truncatedTo(ChronoUnit.MINUTES);
        history = new StoreHistory(storeDir, Clock.systemUTC());
        try {
            history.fill(new FernholmTestPlant(), now.minus(Duration.ofDays(3)), now, Duration.ofMinutes(1),
                    now.minus(Duration.ofMinutes(50)));
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new IllegalStateException(e);
        }
        ShiftCalendar shifts = ShiftCalendar.threeShifts(ZoneId.of("Europe/Berlin"));
        dash = new TestDashboard(UnaryOperator.identity(), s -> s.withStore(history.store, shifts));
        dash.publish(1.0);
        driver = new ChromeDriver(service, options);
        driver.get(dash.baseUrl() + "/#cycle");
    }

    @AfterAll
    static void stop() throws IOException {
        if (driver != null) {
            driver.quit();
        }
        if (dash != null) {
            dash.close();
        }
        if (history != null) {
            history.close();
        }
        for (Path dir : new Path[] {profile, storeDir}) {
            if (dir != null) {
                try (Stream<Path> files = Files.walk(dir)) {
                    files.sorted(Comparator.reverseOrder()).forEach(p -> p.toFile().delete());
                }
            }
        }
    }

    /** Waits that look again when the page re-rendered the element in between. */
    private static WebDriverWait waiting() {
        WebDriverWait w = new WebDriverWait(driver, WAIT);
        w.ignoring(StaleElementReferenceException.class);
        return w;
    }

    private static String text(String css) {
        return driver.findElement(By.cssSelector(css)).getText();
    }

    private static void screenshot(String name) throws IOException {
        Path shot = ((TakesScreenshot) driver).getScreenshotAs(OutputType.FILE).toPath();
        Files.copy(shot, SCREENSHOTS.resolve(name + ".png"), StandardCopyOption.REPLACE_EXISTING);
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

    private static void assertNoScriptRan() {
        assertThrows(NoAlertPresentException.class, () -> driver.switchTo().alert(),
                "markup from data must never run");
    }

    @Test
    @Order(1)
    void theCycleViewShowsLiveValuesAndTheyChangeWhenAResultArrives() throws IOException {
        waiting().until(d -> text("#metric-eta .value").endsWith("%"));
        assertEquals("LIVE", text("#unit-status"));
        String before = text("#metric-eta .value");
        assertTrue(text("#metric-hr .value").contains("kJ/kWh"));

        dash.now.set(FernholmTestPlant.T0.plusSeconds(1));
        dash.publish(1.02);
        waiting().until(d -> !text("#metric-eta .value").equals(before));
        assertNotEquals(before, text("#metric-eta .value"));

        List<WebElement> points = driver.findElements(By.cssSelector("#ts circle.ts-point"));
        int states = dash.plant.result(dash.now.get()).states().size();
        // Every valid state is a point, plus the pump inset's two.
        assertEquals(states + 2, points.size());
        assertTrue(driver.findElement(By.cssSelector("#ts polyline.ts-dome")).isDisplayed());
        assertFalse(driver.findElements(By.cssSelector("#ts polyline.ts-cycle")).isEmpty());
        List<String> labels = driver.findElements(By.cssSelector("#ts text.ts-label")).stream().map(WebElement::getText)
                .toList();
        assertTrue(labels.contains("main_steam"), labels.toString());
        assertTrue(text("#schematic").contains("boiler"));
        // One label per flow line drawn.
        assertSchematicLabelsCoverNothing(driver, driver.findElements(By.cssSelector("#schematic line.sch-flow")).size());
        screenshot("cycle-si");
    }

    @Test
    @Order(2)
    void theAdvisoryBannerIsOnEveryViewAndCannotBeClosed() {
        for (String view : List.of("cycle", "alarms", "trends", "plant")) {
            driver.get(dash.baseUrl() + "/#" + view);
            WebElement banner = waiting().until(d -> d.findElement(By.id("advisory")));
            assertTrue(banner.isDisplayed(), view);
            assertTrue(banner.getText().contains("not a protection or control system"), banner.getText());
            assertTrue(banner.findElements(By.tagName("button")).isEmpty(), "no close button");
        }
    }

    @Test
    @Order(3)
    void theUsCustomarySystemShowsPsiaFahrenheitAndKiloBtuPerKilowattHour() throws IOException {
        driver.get(dash.baseUrl() + "/#cycle");
        waiting().until(d -> text("#metric-eta .value").endsWith("%"));
        driver.findElement(By.id("system-us")).click();
        waiting().until(d -> text("#metric-hr .value").contains("kBtu/kWh"));
        assertTrue(text("#state-table").contains("psia"));
        assertTrue(text("#state-table").contains("°F"));
        screenshot("cycle-us");
        driver.findElement(By.id("system-si")).click();
        waiting().until(d -> text("#metric-hr .value").contains("kJ/kWh"));
    }

    @Test
    @Order(4)
    void anInvalidStateIsMarkedInWordsAndItsValuesAreNotShown() throws IOException {
        dash.now.set(FernholmTestPlant.T0.plusSeconds(2));
        dash.live.publish(dash.plant.resultWithStaleMainSteamTemperature(dash.now.get()));
        waiting().until(d -> text("#state-table").contains("INVALID"));
        WebElement row = driver.findElements(By.cssSelector("#state-table tbody tr")).get(0);
        assertTrue(row.getText().startsWith("main_steam"), row.getText());
        assertTrue(row.getText().contains("INVALID"), row.getText());
        assertTrue(text("#metric-eta .mark").startsWith("INVALID") || text("#metric-eta .value").equals("—"),
                text("#metric-eta"));
        screenshot("cycle-invalid");
        dash.now.set(FernholmTestPlant.T0.plusSeconds(3));
        dash.publish(1.0);
        waiting().until(d -> !text("#state-table").contains("INVALID"));
    }

    @Test
    @Order(4)
    void theWindowChannelsVerdictStandsBesideTheSnapshotsInWords() throws IOException {
        driver.get(dash.baseUrl() + "/#cycle");
        dash.now.set(FernholmTestPlant.T0.plusSeconds(4));
        UnitResult r = dash.plant.result(dash.now.get()).withWindowReconciliation(
                new org.steamtally.calc.cycle.WindowReconciliation(50.0, 50, 50, "failed", 61.2,
                        java.util.OptionalDouble.of(11.07), 5, List.of(new org.steamtally.calc.cycle.Suspect(1, "TT-311",
                                "K", List.of("TT-311", "PT-302"), 8.8, java.util.OptionalDouble.of(0.33),
                                java.util.OptionalDouble.of(0.037), false))));
        dash.live.publish(r);
        waiting().until(d -> text("#checks-table").contains("Mean of the last 50 s"));
        String table = text("#checks-table");
        assertTrue(table.contains("Each snapshot"), table);
        assertTrue(table.contains("FAILED"), table);
        assertTrue(table.contains("suspect: TT-311 (or PT-302)"), table);
        assertTrue(table.contains("χ² 61.20 of limit 11.07"), table);
        assertBanner();
        dash.now.set(FernholmTestPlant.T0.plusSeconds(5));
        dash.publish(1.0);
        waiting().until(d -> !text("#checks-table").contains("Mean of the last"));
    }

    @Test
    @Order(5)
    void aResultOlderThanTheStaleAgeIsMarkedStaleInWords() throws IOException {
        driver.get(dash.baseUrl() + "/#cycle");
        waiting().until(d -> text("#unit-status").equals("LIVE"));
        dash.now.set(dash.now.get().plusSeconds(11));
        // The page asks the server every few seconds; the server judges age by the test's clock.
        waiting().until(d -> text("#unit-status").equals("STALE"));
        assertTrue(text("#stale-banner").startsWith("STALE"), text("#stale-banner"));
        assertEquals("STALE", text("#metric-eta .mark"));
        assertTrue(text("#state-table").contains("STALE"));
        screenshot("cycle-stale");
        dash.publish(1.0);
        waiting().until(d -> text("#unit-status").equals("LIVE"));
    }

    @Test
    @Order(6)
    void markupInTagsAndNamesIsShownAsText() throws IOException {
        driver.get(dash.baseUrl() + "/#plant");
        waiting().until(d -> text("#sensor-table").contains(FernholmTestPlant.SCRIPT_TAG));
        assertNoScriptRan();
        List<String> options = new Select(driver.findElement(By.id("unit-select"))).getOptions().stream()
                .map(WebElement::getText).toList();
        assertTrue(options.stream().anyMatch(o -> o.contains(FernholmTestPlant.SCRIPT_NAME)), options.toString());
        assertTrue(driver.findElements(By.cssSelector("#sensor-table script, #unit-select img")).isEmpty(),
                "no element was made from data");
        screenshot("plant");
    }

    /** Distinct colours among the canvas's pixels: a blank canvas has one, a drawn chart many. */
    private static long coloursOn(String chartCss) {
        Object n = ((JavascriptExecutor) driver).executeScript(
                "const c = document.querySelector(arguments[0] + ' canvas'); if (!c) return 0;"
                        + "const d = c.getContext('2d').getImageData(0, 0, c.width, c.height).data;"
                        + "const seen = new Set(); for (let i = 0; i < d.length; i += 16) seen.add(d[i] << 16 | d[i + 1] << 8 | d[i + 2]);"
                        + "return seen.size;", chartCss);
        return ((Number) n).longValue();
    }

    private static void assertBanner() {
        WebElement banner = driver.findElement(By.id("advisory"));
        assertTrue(banner.isDisplayed());
        assertTrue(banner.getText().contains("not a protection or control system"), banner.getText());
    }

    @Test
    @Order(7)
    void trendsDrawChartsFromTheStoreForEachRange() throws IOException {
        driver.get(dash.baseUrl() + "/#trends");
        waiting().until(d -> text("#trends-message").isEmpty() && coloursOn("#chart-eta") > 20
                && coloursOn("#chart-closure") > 20);
        assertTrue(text("#trends-range").contains("buckets of"), text("#trends-range"));
        for (String chart : List.of("#chart-hr", "#chart-net", "#chart-recon")) {
            assertTrue(coloursOn(chart) > 20, chart + " is drawn");
        }
        // The suspect thermometer's tag is markup; its legend entry shows it as text.
        waiting().until(d -> text("#chart-recon .u-legend").contains(FernholmTestPlant.SCRIPT_TAG));
        assertNoScriptRan();
        assertBanner();
        screenshot("trends-shift");
        driver.findElement(By.cssSelector("#trend-range [data-range=hour]")).click();
        waiting().until(d -> "true".equals(d.findElement(By.cssSelector("#trend-range [data-range=hour]"))
                .getAttribute("aria-pressed")) && text("#trends-range").contains("buckets of 5 s"));
        waiting().until(d -> coloursOn("#chart-recon") > 20);
        screenshot("trends-hour");
        driver.findElement(By.cssSelector("#trend-range [data-range=day]")).click();
        waiting().until(d -> text("#trends-range").contains("buckets of 120 s"));
        assertBanner();
        screenshot("trends-day");
        // Heat rate follows the unit system: kBtu/kWh in US customary.
        driver.findElement(By.id("system-us")).click();
        waiting().until(d -> text("#hr-unit").equals("kBtu/kWh") && text("#trends-message").isEmpty()
                && coloursOn("#chart-hr") > 20);
        driver.findElement(By.id("system-si")).click();
        waiting().until(d -> text("#hr-unit").equals("kJ/kWh"));
    }

    @Test
    @Order(7)
    void theShiftReviewSetsShiftsBesideABaselineMarksDeviationsInWordsAndPrints() throws IOException {
        driver.get(dash.baseUrl() + "/#shifts");
        waiting().until(d -> !text("#shift-table").isEmpty());
        // Review: yesterday and today; baseline: the day before (the store holds three days).
        ((JavascriptExecutor) driver).executeScript(
                "const d = n => { const t = new Date(); t.setDate(t.getDate() - n);"
                        + " return t.getFullYear() + '-' + String(t.getMonth() + 1).padStart(2, '0') + '-'"
                        + " + String(t.getDate()).padStart(2, '0'); };"
                        + "document.getElementById('review-from').value = d(1);"
                        + "document.getElementById('review-to').value = d(0);"
                        + "document.getElementById('base-from').value = d(2);"
                        + "document.getElementById('base-to').value = d(2);");
        driver.findElement(By.id("shift-apply")).click();
        waiting().until(d -> text("#shift-table").contains("Baseline") && text("#shift-table").contains("shifts with data")
                && !text("#shift-table thead th.baseline-col").contains(" 0 shifts"));
        assertTrue(text("#shift-table").contains("Alarms active, h"));
        // The shift with the alarm stands out from an alarm-free baseline, in words and not only by colour.
        assertTrue(text("#shift-table").contains("▼ WORSE"), text("#shift-table"));
        assertTrue(text("#shift-table").contains(FernholmTestPlant.SCRIPT_TAG), "suspect tag shown as text");
        assertNoScriptRan();
        String csv = driver.findElement(By.id("shift-csv")).getAttribute("href");
        assertTrue(csv.contains("/api/v1/units/unit3/shifts?") && csv.endsWith("&format=csv"), csv);
        assertBanner();
        screenshot("shifts");
        ChromeDriver chrome = (ChromeDriver) driver;
        chrome.executeCdpCommand("Emulation.setEmulatedMedia", Map.of("media", "print"));
        try {
            assertFalse(driver.findElement(By.id("shift-form")).isDisplayed(), "the form is not printed");
            assertBanner();
            screenshot("shifts-print");
        } finally {
            chrome.executeCdpCommand("Emulation.setEmulatedMedia", Map.of("media", ""));
        }
    }

    @Test
    @Order(8)
    void acknowledgingNeedsALoginAndWorksAfterIt() throws IOException {
        driver.get(dash.baseUrl() + "/#alarms");
        waiting().until(d -> text("#alarm-table").contains(FernholmTestPlant.SCRIPT_TAG));
        // The store's history of the suspect-sensor alarm: raised, acknowledged and shelved by the operator.
        waiting().until(d -> text("#alarm-history-table").contains("SHELVE"));
        String historyText = text("#alarm-history-table");
        assertTrue(historyText.contains("ACKNOWLEDGE") && historyText.contains(TestDashboard.OPERATOR)
                && historyText.contains("thermometer to be recalibrated, 4 h"), historyText);
        assertNoScriptRan();
        assertTrue(driver.findElements(By.cssSelector("button[data-action=ack]")).isEmpty(),
                "no acknowledge button before login");
        assertTrue(text("#alarm-table").contains("log in to act"));
        screenshot("alarms-logged-out");

        driver.findElement(By.id("login-user")).sendKeys(TestDashboard.OPERATOR);
        driver.findElement(By.id("login-password")).sendKeys(TestDashboard.PASSWORD);
        driver.findElement(By.id("login-button")).click();
        waiting().until(d -> text("#who").equals("ops1 (operator)"));
        By ack = By.cssSelector("button[data-action=ack][data-alarm='" + TestDashboard.SENSOR_ALARM + "']");
        waiting().until(d -> !d.findElements(ack).isEmpty());
        driver.findElement(ack).click();
        waiting().until(d -> dash.alarms.list(FernholmTestPlant.UNIT).stream()
                .anyMatch(a -> a.id().equals(TestDashboard.SENSOR_ALARM) && a.state() == AlarmView.State.ACKNOWLEDGED));
        waiting().until(d -> d.findElement(By.cssSelector("tr[data-alarm-row='" + TestDashboard.SENSOR_ALARM + "']"))
                .getText().contains("ACKNOWLEDGED"));
        assertTrue(dash.audit.entries().stream().anyMatch(e -> e.action().equals("alarm.acknowledge")
                && e.user().equals(TestDashboard.OPERATOR)));
        screenshot("alarms-operator");
    }

    @Test
    @Order(9)
    void withAnonymousViewingOffThePageAsksForALoginAndLoadsAfterIt() {
        try (TestDashboard closed = new TestDashboard(false)) {
            closed.publish(1.0);
            driver.get(closed.baseUrl() + "/#cycle");
            waiting().until(d -> text("#stale-banner").contains("requires a login"));
            driver.findElement(By.id("login-user")).sendKeys(TestDashboard.VIEWER);
            driver.findElement(By.id("login-password")).sendKeys(TestDashboard.PASSWORD);
            driver.findElement(By.id("login-button")).click();
            waiting().until(d -> text("#metric-eta .value").endsWith("%"));
            assertEquals("view1 (viewer)", text("#who"));
        }
    }
}
