package dev.tallyvane.support;

import java.io.File;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.time.Duration;
import java.util.List;
import java.util.Map;
import java.util.logging.Level;
import org.openqa.selenium.By;
import org.openqa.selenium.OutputType;
import org.openqa.selenium.WebDriver;
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
 * Headless Chromium from the operating system's packages (Debian: chromium and chromium-driver),
 * driven through its own chromedriver: the paths are given, so Selenium never looks for or
 * downloads a browser. {@code TALLYVANE_CHROMIUM} and {@code TALLYVANE_CHROMEDRIVER} override them.
 */
public final class Browser implements AutoCloseable {

    public static final String CHROMIUM = env("TALLYVANE_CHROMIUM", "/usr/bin/chromium");
    public static final String CHROMEDRIVER = env("TALLYVANE_CHROMEDRIVER", "/usr/bin/chromedriver");

    private final ChromeDriver driver;
    private final String base;

    private Browser(ChromeDriver driver, String base) {
        this.driver = driver;
        this.base = base;
    }

    /**
     * Starts a browser for the service at {@code base}; fails (never skips) when Chromium is missing,
     * so a machine without it cannot pass the browser tests silently.
     */
    public static Browser open(String base) {
        if (!new File(CHROMIUM).canExecute() || !new File(CHROMEDRIVER).canExecute()) {
            throw new IllegalStateException("Chromium for the browser tests is missing: install the Debian packages "
                    + "chromium and chromium-driver (.ci/run does) or set TALLYVANE_CHROMIUM / TALLYVANE_CHROMEDRIVER");
        }
        ChromeDriverService service = new ChromeDriverService.Builder().usingDriverExecutable(new File(CHROMEDRIVER))
                .usingAnyFreePort().build();
        ChromeOptions options = new ChromeOptions();
        options.setBinary(CHROMIUM);
        options.addArguments("--headless=new", "--no-sandbox", "--disable-gpu", "--disable-dev-shm-usage",
                "--window-size=1366,1000", "--lang=en-GB", "--no-first-run", "--disable-extensions");
        options.setExperimentalOption("prefs", Map.of("intl.accept_languages", "en-GB"));
        LoggingPreferences logs = new LoggingPreferences();
        logs.enable(LogType.BROWSER, Level.ALL);
        options.setCapability("goog:loggingPrefs", logs);
        ChromeDriver driver = new ChromeDriver(service, options);
        driver.manage().timeouts().pageLoadTimeout(Duration.ofSeconds(30));
        return new Browser(driver, base);
    }

    private static String env(String name, String fallback) {
        String v = System.getenv(name);
        return v == null || v.isBlank() ? fallback : v;
    }

    public WebDriver driver() {
        return driver;
    }

    public void go(String path) {
        driver.get(base + path);
    }

    public WebElement find(String css) {
        return driver.findElement(By.cssSelector(css));
    }

    public List<WebElement> all(String css) {
        return driver.findElements(By.cssSelector(css));
    }

    /** Waits up to {@code seconds} for an element matching {@code css} to be visible. */
    public WebElement await(String css, int seconds) {
        return new WebDriverWait(driver, Duration.ofSeconds(seconds))
                .until(ExpectedConditions.visibilityOfElementLocated(By.cssSelector(css)));
    }

    /**
     * Clicks what leads to another page and waits until the old page is gone, so nothing read next
     * belongs to the page being left (a stale element otherwise, when the new page arrives late).
     */
    public void clickToLoad(String css) {
        org.openqa.selenium.JavascriptExecutor js = (org.openqa.selenium.JavascriptExecutor) driver;
        js.executeScript("window.__tallyvaneLeaving = true");
        find(css).click();
        // the mark lives on the old page's window: gone once the new page is there (a script run while the
        // browser is between the two pages may fail; that is "not yet")
        new WebDriverWait(driver, Duration.ofSeconds(20)).ignoring(org.openqa.selenium.WebDriverException.class)
                .until(d -> Boolean.TRUE.equals(js.executeScript(
                        "return window.__tallyvaneLeaving === undefined && document.readyState === 'complete'")));
    }

    public String text() {
        return driver.findElement(By.tagName("body")).getText();
    }

    public void signIn(String user, String password) {
        go("/login");
        find("#username").sendKeys(user);
        find("#password").sendKeys(password);
        find("button[type=submit]").click();
        await("nav[aria-label=Main]", 10);
    }

    /** Saves a full-page screenshot to target/screenshots/{name}.png and returns the file. */
    public Path screenshot(String name) throws IOException {
        Path dir = Path.of("target", "screenshots");
        Files.createDirectories(dir);
        Path to = dir.resolve(name + ".png");
        File shot = driver.getScreenshotAs(OutputType.FILE);
        Files.copy(shot.toPath(), to, StandardCopyOption.REPLACE_EXISTING);
        return to;
    }

    /** Browser console errors so far (CSP violations, script errors, failed requests). */
    public List<String> consoleErrors() {
        return driver.manage().logs().get(LogType.BROWSER).getAll().stream()
                .filter(e -> e.getLevel().intValue() >= Level.SEVERE.intValue()).map(LogEntry::getMessage).toList();
    }

    /** Sizes the window to the page's height, for a full-page screenshot. */
    public void fitHeight() {
        Object h = driver.executeScript("return document.documentElement.scrollHeight");
        driver.manage().window().setSize(new org.openqa.selenium.Dimension(1366, Math.min(6000,
                ((Number) h).intValue() + 40)));
    }

    /** Quits, first keeping the last page (HTML and picture) under target/screenshots/{name}-last.* for diagnosis. */
    public void close(String name) {
        try {
            Files.createDirectories(Path.of("target", "screenshots"));
            Files.writeString(Path.of("target", "screenshots", name + "-last.html"), driver.getPageSource());
            screenshot(name + "-last");
        } catch (IOException | RuntimeException e) {
            // diagnosis only
        }
        close();
    }

    @Override
    public void close() {
        driver.quit();
    }
}
