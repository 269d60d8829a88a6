package dev.tallyvane.e2e;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.IOException;
import java.net.ServerSocket;
import java.net.URI;
import java.net.http.HttpRequest;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

/** The packaged service (target/tallyvane.jar) as a separate process on a free port, with its console in a file. */
final class ServiceJar {

    final Process process;
    final Path console;
    final int port;

    private ServiceJar(Process process, Path console, int port) {
        this.process = process;
        this.console = console;
        this.port = port;
    }

    /** Starts the jar with a fresh data folder, no SMTP server, and {@code args} (JVM options first, then settings). */
    static ServiceJar start(List<String> jvm, String... args) throws IOException {
        Path jar = Path.of(System.getProperty("tallyvane.jar", "target/tallyvane.jar"));
        assertThat(jar).exists();
        int port;
        try (ServerSocket s = new ServerSocket(0)) {
            port = s.getLocalPort();
        }
        Path data = Files.createTempDirectory("tallyvane-e2e");
        Path console = data.resolve("console.log");
        List<String> command = new ArrayList<>(List.of(Path.of(System.getProperty("java.home"), "bin", "java").toString()));
        command.addAll(jvm);
        command.addAll(List.of("-jar", jar.toString(), "--server.port=" + port, "--tallyvane.data-dir=" + data,
                "--spring.mail.port=1"));
        command.addAll(List.of(args));
        Process p = new ProcessBuilder(command).redirectErrorStream(true).redirectOutput(console.toFile()).start();
        return new ServiceJar(p, console, port);
    }

    URI uri(String path) {
        return URI.create("http://127.0.0.1:" + port + path);
    }

    /** The last 40 console lines, for failure messages. */
    String tail() throws IOException {
        if (!Files.exists(console)) {
            return "";
        }
        List<String> lines = Files.readAllLines(console);
        return String.join("\n", lines.subList(Math.max(0, lines.size() - 40), lines.size()));
    }

    /** SIGKILL: no shutdown hooks, no graceful anything. */
    void kill() throws Exception {
        new ProcessBuilder("kill", "-9", Long.toString(process.pid())).start().waitFor();
        process.waitFor();
    }

    void stop() throws InterruptedException {
        if (process.isAlive()) {
            process.destroy();
            process.waitFor();
        }
    }

    static String csrf(String html) {
        Matcher m = Pattern.compile("name=\"_csrf\" value=\"([^\"]+)\"").matcher(html);
        assertThat(m.find()).as("a CSRF token in the page").isTrue();
        return m.group(1);
    }

    /** A POST of one file as the upload form sends it, with the page's CSRF token in the header the upload script uses. */
    HttpRequest upload(String fileName, byte[] content, String pageWithToken) {
        return dev.tallyvane.support.MultipartUpload.of(uri("/uploads"), csrf(pageWithToken), fileName, content);
    }
}
