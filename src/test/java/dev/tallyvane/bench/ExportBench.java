package dev.tallyvane.bench;

import dev.tallyvane.app.TallyvaneApplication;
import dev.tallyvane.export.ExportService;
import dev.tallyvane.intake.IntakeService;
import dev.tallyvane.location.LocationService;
import dev.tallyvane.support.PostgresDatabase;
import java.io.OutputStream;
import java.lang.management.ManagementFactory;
import java.lang.management.MemoryPoolMXBean;
import java.lang.management.MemoryType;
import org.junit.jupiter.api.Test;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.boot.test.context.SpringBootTest;
import org.springframework.test.context.DynamicPropertyRegistry;
import org.springframework.test.context.DynamicPropertySource;

/**
 * Export streaming benchmark (not part of the normal test run; see docs/benchmarks.md):
 * <pre>TALLYVANE_TEST_PG_URL=jdbc:postgresql://127.0.0.1:5432/test ./mvnw -B test -Dtest=ExportBench \
 *     -Dsurefire.failIfNoSpecifiedTests=false -DargLine=-Xmx256m</pre>
 * Exports the figures (with revisions) of 1,000 locations × 3 years daily, 1,095,000 rows, as CSV
 * and as XLSX to a byte-counting stream, and reports the time and the peak heap in use, with the
 * heap capped at 256 MB.
 */
@SpringBootTest(classes = TallyvaneApplication.class, properties = "tallyvane.refit.coalesce=1h")
class ExportBench {

    @DynamicPropertySource
    static void postgres(DynamicPropertyRegistry registry) {
        PostgresDatabase.registerFresh(registry);
    }

    @Autowired
    LocationService locations;
    @Autowired
    IntakeService intake;
    @Autowired
    ExportService exports;

    static final class Counting extends OutputStream {
        long bytes;

        @Override
        public void write(int b) {
            bytes++;
        }

        @Override
        public void write(byte[] b, int off, int len) {
            bytes += len;
        }
    }

    @Test
    void figuresOfAThousandLocations() throws Exception {
        DailyChain.load(locations, intake, 1000);
        for (ExportService.Format format : ExportService.Format.values()) {
            System.gc();
            for (MemoryPoolMXBean pool : ManagementFactory.getMemoryPoolMXBeans()) {
                pool.resetPeakUsage();
            }
            long before = heapUsed();
            Counting out = new Counting();
            long t0 = System.nanoTime();
            exports.write(new ExportService.Request(ExportService.Dataset.FIGURES, format, null, "net_sales", null, null,
                    ','), out);
            double seconds = (System.nanoTime() - t0) / 1e9;
            long peak = 0;
            for (MemoryPoolMXBean pool : ManagementFactory.getMemoryPoolMXBeans()) {
                if (pool.getType() == MemoryType.HEAP) {
                    peak += pool.getPeakUsage().getUsed();
                }
            }
            System.out.printf("BENCH export figures %s: 1,095,000 rows, %.1f MB in %.1f s; heap in use before %.0f MB, "
                    + "peak during %.0f MB (max heap %.0f MB)%n", format, out.bytes / 1e6, seconds, before / 1e6, peak / 1e6,
                    Runtime.getRuntime().maxMemory() / 1e6);
        }
    }

    private static long heapUsed() {
        return ManagementFactory.getMemoryMXBean().getHeapMemoryUsage().getUsed();
    }
}
