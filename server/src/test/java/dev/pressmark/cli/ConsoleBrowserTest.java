package dev.pressmark.cli;

import static org.assertj.core.api.Assertions.assertThat;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

import dev.pressmark.core.Progress;
import java.io.File;
import java.io.IOException;
import java.io.OutputStream;
import java.io.PrintStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.time.Duration;
import java.util.List;
import java.util.Map;
import java.util.logging.Level;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.openqa.selenium.By;
import org.openqa.selenium.Dimension;
import org.openqa.selenium.JavascriptExecutor;
import org.openqa.selenium.OutputType;
import org.openqa.selenium.WebElement;
import org.openqa.selenium.chrome.ChromeDriver;
import org.openqa.selenium.chrome.ChromeDriverService;
import org.openqa.selenium.chrome.ChromeOptions;
import org.openqa.selenium.logging.LogEntry;
import org.openqa.selenium.logging.LogType;
import org.openqa.selenium.logging.LoggingPreferences;
import org.openqa.selenium.support.ui.ExpectedConditions;
import org.openqa.selenium.support.ui.WebDriverWait;

/**
 * The web console in a real browser (the system's Chromium through its own chromedriver, never a
 * downloaded one) against the demo: the models show, the score panel labels a title, splits one bar
 * into the label probabilities, largest first, and colours its subwords, and a roll-back with the admin token makes v1 the active version. Screenshots go to
 * {@code target/console-*.png} for a person to look at.
 */
class ConsoleBrowserTest {

    private static final Path CHROMEDRIVER = Path.of("/usr/bin/chromedriver");
    private static final Path CHROMIUM = Path.of("/usr/bin/chromium");
    private static final Duration WAIT = Duration.ofSeconds(20);

    @TempDir
    static Path dir;

    private static Demo demo;

    @BeforeAll
    static void startDemo() throws IOException {
        assumeTrue(Files.isExecutable(CHROMEDRIVER), "no " + CHROMEDRIVER + " (apt-get install chromium chromium-driver)");
        Path store = Files.createDirectories(dir.resolve("store"));
        demo = Demo.start(store, false, 0, Progress.NONE, new PrintStream(OutputStream.nullOutputStream()));
    }

    @AfterAll
    static void stopDemo() {
        if (demo != null) {
            demo.close();
            // Not temporary: the store stays where the caller asked for it.
            assertThat(demo.dir().resolve("pressmark.db")).exists();
        }
    }

    private static ChromeDriver browser(Path profile) {
        // Selenium looks here before it would ever fetch a driver of its own.
        System.setProperty("webdriver.chrome.driver", CHROMEDRIVER.toString());
        ChromeOptions options = new ChromeOptions();
        options.setBinary(CHROMIUM.toFile());
        options.addArguments("--headless=new", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run",
                "--disable-background-networking", "--disable-component-update", "--disable-sync", "--disable-dev-shm-usage",
                "--window-size=1280,800", "--user-data-dir=" + profile);
        LoggingPreferences logs = new LoggingPreferences();
        logs.enable(LogType.BROWSER, Level.ALL);
        options.setCapability("goog:loggingPrefs", logs);
        ChromeDriverService service = new ChromeDriverService.Builder().usingDriverExecutable(CHROMEDRIVER.toFile()).usingAnyFreePort().build();
        return new ChromeDriver(service, options);
    }

    private static void screenshot(ChromeDriver driver, String name) throws IOException {
        File shot = driver.getScreenshotAs(OutputType.FILE);
        Path target = Path.of("target", "console-" + name + ".png");
        Files.createDirectories(target.getParent());
        Files.copy(shot.toPath(), target, StandardCopyOption.REPLACE_EXISTING);
    }

    /** Sets the page's viewport, not the window's outer size, so that screenshots have the size asked for. */
    private static void viewport(ChromeDriver driver, int width, int height) {
        driver.manage().window().setSize(new Dimension(width, height));
        JavascriptExecutor js = driver;
        long innerWidth = (Long) js.executeScript("return window.innerWidth");
        long innerHeight = (Long) js.executeScript("return window.innerHeight");
        driver.manage().window().setSize(new Dimension(2 * width - (int) innerWidth, 2 * height - (int) innerHeight));
    }

    @Test
    void shows_the_models_explains_a_title_and_rolls_back_with_the_admin_token(@TempDir Path profile) throws IOException {
        ChromeDriver driver = browser(profile);
        try {
            WebDriverWait wait = new WebDriverWait(driver, WAIT);
            driver.get(demo.baseUrl() + "/");
            viewport(driver, 1280, 800);

            WebElement card = wait.until(ExpectedConditions.visibilityOfElementLocated(By.cssSelector(".model-card[data-model='routing']")));
            wait.until(ExpectedConditions.textToBePresentInElement(card, "active v2"));
            wait.until(ExpectedConditions.numberOfElementsToBe(By.cssSelector("#versions tbody tr"), 2));
            assertThat(driver.findElement(By.cssSelector("#versions tr.is-active")).getAttribute("data-tag")).isEqualTo("v2");
            wait.until(ExpectedConditions.presenceOfElementLocated(By.cssSelector("#confusion svg")));
            wait.until(ExpectedConditions.numberOfElementsToBe(By.cssSelector("#features svg"), 4));
            // v2's settings came from a small search: its candidates, the chosen one marked.
            assertThat(driver.findElement(By.id("search-section")).isDisplayed()).isTrue();
            assertThat(driver.findElements(By.cssSelector("#search tbody tr"))).hasSize(3);
            assertThat(driver.findElements(By.cssSelector("#search tbody tr.chosen"))).hasSize(1);
            assertThat(driver.findElements(By.cssSelector("#search thead th"))).extracting(WebElement::getText)
                    .contains("classifier.c", "accuracy (cv)");
            // The drift panel reads the active version's window: its version, a status badge and the training rate.
            wait.until(ExpectedConditions.textToBe(By.id("drift-version"), "routing v2"));
            assertThat(driver.findElement(By.id("drift-status")).getText()).isIn("ok", "watch", "drift", "no traffic yet");
            assertThat(driver.findElements(By.cssSelector("#drift dt"))).extracting(WebElement::getText)
                    .contains("stability index", "unknown tokens, live", "unknown tokens, training");

            // A brand the data never had, with a part every department sells: only its first syllable tells.
            WebElement input = driver.findElement(By.cssSelector(".score-input[data-field='title']"));
            input.sendKeys("Quorubwick service kit 3/4in");
            wait.until(ExpectedConditions.textToBe(By.id("score-label"), "plumbing"));
            // One stacked bar, a segment per label, largest first, and a legend in the same order that sums to 100 %.
            List<WebElement> legend = driver.findElements(By.cssSelector("#score-legend li"));
            List<WebElement> segments = driver.findElements(By.cssSelector("#score-bar .segment"));
            assertThat(legend).hasSize(4);
            assertThat(segments).extracting(e -> e.getAttribute("data-label"))
                    .containsExactlyElementsOf(legend.stream().map(e -> e.getAttribute("data-label")).toList());
            assertThat(legend.get(0).getAttribute("data-label")).isEqualTo("plumbing");
            assertThat(legend.get(0).getAttribute("class")).contains("chosen");
            List<Double> shares = legend.stream().map(e -> Double.parseDouble(e.findElement(By.className("num")).getText().replace(" %", ""))).toList();
            assertThat(shares).isSortedAccordingTo(java.util.Comparator.reverseOrder());
            // each share is rounded to 0.1 %: four of them sum to 100 within 4 x 0.05
            assertThat(shares.stream().mapToDouble(Double::doubleValue).sum()).isCloseTo(100.0, org.assertj.core.data.Offset.offset(0.2));
            List<Integer> widths = segments.stream().map(e -> e.getRect().getWidth()).toList();
            assertThat(widths.get(0)).isGreaterThan(widths.get(widths.size() - 1));
            assertThat(segments.get(0).getCssValue("background-color")).isNotEqualTo(segments.get(1).getCssValue("background-color"));
            assertThat(legend.get(0).findElement(By.className("swatch")).getCssValue("background-color"))
                    .isEqualTo(segments.get(0).getCssValue("background-color"));
            List<WebElement> chips = driver.findElements(By.cssSelector("#score-subwords li.chip"));
            assertThat(chips).isNotEmpty();
            WebElement quor = chips.stream().filter(c -> c.findElement(By.tagName("code")).getText().equals("quor")).findFirst().orElseThrow();
            assertThat(quor.getAttribute("class")).contains("pos");
            assertThat(quor.findElement(By.className("sign")).getText()).isEqualTo("+");
            // Colour and sign together: a chip marked + is green-tinted, one marked − is not the same colour.
            String positive = quor.getCssValue("color");
            chips.stream().filter(c -> c.getAttribute("class").contains("neg")).findFirst().ifPresent(neg -> {
                assertThat(neg.findElement(By.className("sign")).getText()).isEqualTo("\u2212");
                assertThat(neg.getCssValue("color")).isNotEqualTo(positive);
            });
            screenshot(driver, "1280x800");
            ((JavascriptExecutor) driver).executeScript("document.getElementById('search-heading').scrollIntoView()");
            screenshot(driver, "1280x800-search");
            ((JavascriptExecutor) driver).executeScript("document.getElementById('confusion-heading').scrollIntoView()");
            screenshot(driver, "1280x800-charts");
            ((JavascriptExecutor) driver).executeScript("window.scrollTo(0, 0)");

            driver.findElement(By.id("rollback")).click();
            WebElement dialog = wait.until(ExpectedConditions.visibilityOfElementLocated(By.id("token-dialog")));
            assertThat(dialog.findElement(By.id("token-title")).getText()).isEqualTo("Admin token");
            WebElement token = driver.findElement(By.id("token-input"));
            assertThat(driver.switchTo().activeElement()).isEqualTo(token);
            token.sendKeys(demo.adminToken());
            screenshot(driver, "1280x800-token");
            driver.findElement(By.cssSelector("#token-form button[type='submit']")).click();

            wait.until(ExpectedConditions.textToBePresentInElementLocated(By.cssSelector(".model-card[data-model='routing']"), "active v1"));
            wait.until(ExpectedConditions.attributeToBe(By.cssSelector("#versions tr.is-active"), "data-tag", "v1"));
            assertThat(driver.findElement(By.id("notice")).getText()).contains("v1 is active");
            // Another active version, another window.
            wait.until(ExpectedConditions.textToBe(By.id("drift-version"), "routing v1"));
            // The score panel asks again, now of v1.
            wait.until(ExpectedConditions.textToBePresentInElementLocated(By.cssSelector("#score-result .prediction"), "routing v1"));

            // v2 set beside the now active v1: every difference is v2's lead, marked better in words and by an arrow.
            driver.findElement(By.cssSelector("#versions tr[data-tag='v2'] button[aria-pressed]")).click();
            wait.until(ExpectedConditions.textToBePresentInElementLocated(By.id("compare-title"), "v2 against the active v1"));
            WebElement accuracy = driver.findElements(By.cssSelector("#comparison tbody tr")).stream()
                    .filter(r -> r.findElement(By.tagName("th")).getText().equals("accuracy")).findFirst().orElseThrow();
            WebElement delta = accuracy.findElements(By.tagName("td")).get(2);
            assertThat(delta.getAttribute("class")).contains("better");
            assertThat(delta.getText()).startsWith("\u25B2 +0.").endsWith("better");
            wait.until(ExpectedConditions.textToBePresentInElementLocated(By.id("confusion-heading"), "v2"));
            screenshot(driver, "1280x800-compare");

            // The page follows the system's colour scheme.
            String light = driver.findElement(By.tagName("body")).getCssValue("background-color");
            driver.executeCdpCommand("Emulation.setEmulatedMedia",
                    Map.of("features", List.of(Map.of("name", "prefers-color-scheme", "value", "dark"))));
            assertThat(driver.findElement(By.tagName("body")).getCssValue("background-color")).isNotEqualTo(light);
            screenshot(driver, "1280x800-dark");
            driver.executeCdpCommand("Emulation.setEmulatedMedia", Map.of("features", List.of()));

            viewport(driver, 390, 844);
            screenshot(driver, "390x844");
            // the panel alone: a page screenshot after a long scroll can come back before the page is painted there
            File panel = driver.findElement(By.cssSelector("section.score")).getScreenshotAs(OutputType.FILE);
            Files.copy(panel.toPath(), Path.of("target", "console-390x844-score.png"), StandardCopyOption.REPLACE_EXISTING);
            Object wide = ((JavascriptExecutor) driver).executeScript("const w = document.documentElement.clientWidth;"
                    + " return [...document.querySelectorAll('body *')].filter(e => e.getBoundingClientRect().right > w + 0.5"
                    + " && !e.parentElement.closest('.table-wrap')).map(e => e.tagName + (e.id ? '#' + e.id : '') + '.' + e.className"
                    + " + ' ' + Math.round(e.getBoundingClientRect().right)).join(', ')");
            long overflow = (Long) ((JavascriptExecutor) driver).executeScript(
                    "return document.documentElement.scrollWidth - document.documentElement.clientWidth");
            assertThat(overflow).as("no sideways scrolling at phone width; wider than the page: %s", wide).isLessThanOrEqualTo(0);

            List<LogEntry> errors = driver.manage().logs().get(LogType.BROWSER).getAll().stream()
                    .filter(e -> e.getLevel().intValue() >= Level.WARNING.intValue()).toList();
            assertThat(errors).as("browser console: content security policy reports, script errors").isEmpty();
        } finally {
            driver.quit();
        }
    }
}
