package dev.tallyvane.engine;

import java.io.IOException;
import java.io.InputStream;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.TreeSet;

/**
 * Loads a reference file from {@code src/test/resources/reference} (copied from the shared
 * reference folder, sources kept in each file's header): the machine-readable header lines
 * {@code # status.name = value} and the data columns named by {@code # columns: ...}.
 *
 * <p>Asking for a key the file does not have fails, so a typo can never skip a check silently;
 * {@link #unusedKeys(String)} lets a test prove it checked every value of a kind.
 */
public final class ReferenceData {

    private final String file;
    private final Map<String, String> values = new LinkedHashMap<>();
    private final Map<String, double[]> columns = new LinkedHashMap<>();
    private final Set<String> used = new TreeSet<>();

    private ReferenceData(String file) {
        this.file = file;
    }

    public static ReferenceData load(String name) {
        ReferenceData ref = new ReferenceData(name);
        try (InputStream in = ReferenceData.class.getResourceAsStream("/reference/" + name)) {
            if (in == null) {
                throw new IllegalArgumentException("no reference file " + name);
            }
            String[] lines = new String(in.readAllBytes(), StandardCharsets.UTF_8).split("\\R");
            List<String> names = null;
            List<double[]> rows = new ArrayList<>();
            for (String line : lines) {
                if (line.startsWith("#")) {
                    String body = line.substring(1).trim();
                    if (body.startsWith("columns:")) {
                        names = Arrays.asList(body.substring("columns:".length()).trim().split("\\s+"));
                    } else if (body.matches("(certified|published|computed|recalled)\\.[A-Za-z0-9_.]+ = .*")) {
                        int eq = body.indexOf(" = ");
                        ref.values.put(body.substring(0, eq), body.substring(eq + 3).trim());
                    }
                } else if (!line.isBlank()) {
                    rows.add(Arrays.stream(line.trim().split("\\s+")).mapToDouble(Double::parseDouble).toArray());
                }
            }
            if (names == null) {
                throw new IllegalStateException(name + " has no '# columns:' line");
            }
            for (int c = 0; c < names.size(); c++) {
                double[] col = new double[rows.size()];
                for (int r = 0; r < rows.size(); r++) {
                    col[r] = rows.get(r)[c];
                }
                ref.columns.put(names.get(c), col);
            }
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
        return ref;
    }

    public double[] column(String name) {
        double[] c = columns.get(name);
        if (c == null) {
            throw new IllegalArgumentException(file + " has no column '" + name + "'; it has " + columns.keySet());
        }
        return c.clone();
    }

    public String text(String key) {
        String v = values.get(key);
        if (v == null) {
            throw new IllegalArgumentException(file + " has no key '" + key + "'");
        }
        if (key.startsWith("recalled.")) {
            throw new IllegalArgumentException(file + ": '" + key + "' is recalled from memory and is no test oracle");
        }
        used.add(key);
        return v;
    }

    public double number(String key) {
        return Double.parseDouble(text(key));
    }

    public double[] numbers(String key) {
        return Arrays.stream(text(key).split("\\s+")).mapToDouble(Double::parseDouble).toArray();
    }

    public boolean has(String key) {
        return values.containsKey(key);
    }

    /** Keys with the prefix that no check has read yet. */
    public Set<String> unusedKeys(String prefix) {
        Set<String> out = new TreeSet<>();
        for (String k : values.keySet()) {
            if (k.startsWith(prefix) && !used.contains(k)) {
                out.add(k);
            }
        }
        return out;
    }
}
