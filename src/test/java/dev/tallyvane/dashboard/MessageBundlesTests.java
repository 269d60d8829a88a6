package dev.tallyvane.dashboard;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.IOException;
import java.io.InputStreamReader;
import java.io.Reader;
import java.nio.charset.StandardCharsets;
import java.util.Properties;
import java.util.TreeSet;
import org.junit.jupiter.api.Test;

/** Every message key exists, non-empty, in every bundle, and every glossary term has its name and sentence. */
class MessageBundlesTests {

    static final String[] BUNDLES = {"messages.properties", "messages_de.properties"};

    static Properties load(String name) throws IOException {
        Properties p = new Properties();
        try (Reader r = new InputStreamReader(MessageBundlesTests.class.getResourceAsStream("/" + name),
                StandardCharsets.UTF_8)) {
            p.load(r);
        }
        return p;
    }

    @Test
    void everyKeyIsInEveryBundle() throws IOException {
        Properties base = load(BUNDLES[0]);
        assertThat(base).hasSizeGreaterThan(50);
        for (String name : BUNDLES) {
            Properties p = load(name);
            assertThat(new TreeSet<>(p.stringPropertyNames())).as(name).isEqualTo(new TreeSet<>(base
                    .stringPropertyNames()));
            assertThat(p.stringPropertyNames()).as(name + ": empty values").allMatch(k -> !p.getProperty(k).isBlank());
        }
    }

    @Test
    void everyTermHasANameAndASentence() throws IOException {
        for (String name : BUNDLES) {
            Properties p = load(name);
            for (Glossary t : Glossary.values()) {
                assertThat(p.getProperty("term." + t.key() + ".name")).as(name + " " + t).isNotBlank();
                assertThat(p.getProperty("term." + t.key() + ".text")).as(name + " " + t).isNotBlank().endsWith(".");
            }
        }
        assertThat(Glossary.TRACKING_SIGNAL.key()).isEqualTo("trackingSignal");
        assertThat(Glossary.keyOf("TRIGG")).isEqualTo("trackingSignal");
        assertThat(Glossary.keyOf("ERROR_RATIO")).isEqualTo("errorRatio");
    }

    /**
     * A message with arguments goes through {@link java.text.MessageFormat}, where a lone apostrophe
     * starts a quoted part and swallows the placeholders after it: such messages write it twice.
     */
    @Test
    void messagesWithArgumentsDoubleTheirApostrophes() throws IOException {
        for (String name : BUNDLES) {
            Properties p = load(name);
            for (String k : p.stringPropertyNames()) {
                String v = p.getProperty(k);
                if (v.matches("(?s).*\\{\\d.*")) {
                    assertThat(v.replace("''", "")).as(name + " " + k).doesNotContain("'");
                    assertThat(new java.text.MessageFormat(v).format(new Object[] {1, "b", "c", "d"})).as(name + " " + k)
                            .doesNotContain("{0").doesNotContain("{1");
                }
            }
        }
    }

    @Test
    void theGermanBundleIsReallyGerman() throws IOException {
        Properties de = load("messages_de.properties");
        Properties en = load("messages.properties");
        long same = en.stringPropertyNames().stream().filter(k -> en.getProperty(k).equals(de.getProperty(k))).count();
        // names of metrics (MASE, CUSUM…), a few words (Status, Name) and the product name are the same in
        // both; the sentences are not
        assertThat(same).isLessThan(en.size() / 20);
        assertThat(de.getProperty("nav.locations")).isEqualTo("Standorte");
    }
}
