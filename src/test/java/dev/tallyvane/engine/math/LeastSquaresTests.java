package dev.tallyvane.engine.math;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import dev.tallyvane.engine.ReferenceData;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

/**
 * Checks {@link LeastSquares} against the certified values of the NIST Statistical Reference
 * Datasets, Linear Least Squares Regression (NIST ITL, StRD; files copied from the shared reference
 * folder with their source headers). The design matrix is built exactly as each file's model line
 * says (raw powers of x, or x1..x6 for Longley).
 *
 * <p>Accuracy is the log relative error LRE = −log₁₀(|est − cert| / |cert|) (McCullough, "Assessing
 * the reliability of statistical software", The American Statistician 52, 1998), the measure the
 * StRD documentation suggests. The bar is ≥ 7 significant digits for every coefficient, standard
 * deviation, the residual SD and R², as the issue asks; for a certified value of 0 (Wampler1/2
 * exact fits) the absolute error must be below 1e-7 times the scale of the response.
 */
class LeastSquaresTests {

    @ParameterizedTest(name = "NIST StRD {0}: ≥ {2} digits")
    @CsvSource({
        // file, polynomial degree (0 = Longley's six predictors), minimum LRE
        "nist-strd-norris.txt, 1, 7",
        "nist-strd-pontius.txt, 2, 7",
        "nist-strd-longley.txt, 0, 7",
        "nist-strd-wampler1.txt, 5, 7",
        "nist-strd-wampler2.txt, 5, 7",
        "nist-strd-wampler3.txt, 5, 7",
        "nist-strd-wampler4.txt, 5, 7",
        "nist-strd-wampler5.txt, 5, 7",
    })
    void reproducesCertifiedValues(String file, int degree, double minimumLre) {
        ReferenceData ref = ReferenceData.load(file);
        double[][] x = design(ref, degree);
        double[] y = ref.column("y");
        LeastSquares.Fit fit = LeastSquares.fit(x, y);
        double yScale = maxAbs(y);
        for (int j = 0; j < fit.p(); j++) {
            // NIST StRD certified values, file header "certified.Bj" and "certified.Bj.sd"
            assertDigits(file, "B" + j, fit.coefficients()[j], ref.number("certified.B" + j), minimumLre, yScale);
            assertDigits(file, "B" + j + ".sd", fit.standardErrors()[j], ref.number("certified.B" + j + ".sd"),
                    minimumLre, yScale);
        }
        // NIST StRD certified residual standard deviation and R²
        assertDigits(file, "residual_sd", fit.residualSd(), ref.number("certified.residual_sd"), minimumLre, yScale);
        assertDigits(file, "r_squared", fit.rSquared(), ref.number("certified.r_squared"), minimumLre, 1);
        assertThat(ref.unusedKeys("certified.B")).as("every certified coefficient checked").isEmpty();
    }

    /**
     * Filip (degree 10, condition number about 1e15) is the hardest StRD case; the issue asks only
     * to report it. Double-precision QR on raw powers recovers only a few digits; we require the
     * fit not to be truncated (full rank, R² to ≥ 6 digits) and print the LRE of each coefficient.
     */
    @Test
    void reportsFilip() {
        ReferenceData ref = ReferenceData.load("nist-strd-filip.txt");
        LeastSquares.Fit fit = LeastSquares.fit(design(ref, 10), ref.column("y"));
        StringBuilder report = new StringBuilder("NIST StRD Filip, LRE per coefficient:");
        double minLre = Double.POSITIVE_INFINITY;
        for (int j = 0; j <= 10; j++) {
            double lre = lre(fit.coefficients()[j], ref.number("certified.B" + j));
            minLre = Math.min(minLre, lre);
            report.append(String.format(" B%d=%.1f", j, lre));
        }
        System.out.println(report);
        // NIST StRD Filip certified R² = 0.996727416185620
        assertThat(lre(fit.rSquared(), ref.number("certified.r_squared"))).isGreaterThanOrEqualTo(6);
        assertThat(fit.p()).isEqualTo(11);
    }

    @Test
    void rejectsTooFewObservationsAndNonFiniteValues() {
        assertThatThrownBy(() -> LeastSquares.fit(new double[][] {{1, 2}, {1, 3}}, new double[] {1, 2}))
                .hasMessageContaining("n = 2, p = 2");
        assertThatThrownBy(() -> LeastSquares.fit(new double[][] {{1}, {1}, {1}}, new double[] {1, Double.NaN, 2}))
                .hasMessageContaining("non-finite");
        assertThatThrownBy(() -> LeastSquares.fit(new double[][] {{1, 0}, {1, 0}, {1, 0}}, new double[] {1, 2, 3}))
                .hasMessageContaining("column 1 is all zeros");
    }

    /**
     * The quick normal-equations path never gives a wrong answer: on every NIST StRD problem it either
     * refuses (null) or reproduces the certified coefficients to at least 6 digits; it answers on the easy
     * ones (Norris, a straight line) and refuses Filip (condition number about 1e15).
     */
    @ParameterizedTest(name = "NIST StRD {0}, quickly: refused or ≥ 6 digits")
    @CsvSource({
        "nist-strd-norris.txt, 1, true",
        "nist-strd-pontius.txt, 2, false",
        "nist-strd-longley.txt, 0, false",
        "nist-strd-wampler1.txt, 5, false",
        "nist-strd-wampler2.txt, 5, false",
        "nist-strd-wampler3.txt, 5, false",
        "nist-strd-wampler4.txt, 5, false",
        "nist-strd-wampler5.txt, 5, false",
        "nist-strd-filip.txt, 10, false",
    })
    void quickCoefficientsAreRightOrRefused(String file, int degree, boolean mustAnswer) {
        ReferenceData ref = ReferenceData.load(file);
        double[][] x = design(ref, degree);
        double[][] columns = new double[x[0].length][x.length];
        for (int i = 0; i < x.length; i++) {
            for (int j = 0; j < x[0].length; j++) {
                columns[j][i] = x[i][j];
            }
        }
        double[] y = ref.column("y");
        double[] b = LeastSquares.coefficientsQuickly(columns, y);
        if (file.contains("filip")) {
            assertThat(b).as("Filip is refused").isNull();
            return;
        }
        if (mustAnswer) {
            assertThat(b).as(file).isNotNull();
        }
        if (b != null) {
            for (int j = 0; j < b.length; j++) {
                // NIST StRD certified values, file header "certified.Bj"
                assertDigits(file, "B" + j, b[j], ref.number("certified.B" + j), 6, maxAbs(y));
            }
        }
    }

    static double[][] design(ReferenceData ref, int degree) {
        if (degree == 0) {
            int n = ref.column("y").length;
            double[][] x = new double[n][7];
            for (int k = 1; k <= 6; k++) {
                double[] col = ref.column("x" + k);
                for (int i = 0; i < n; i++) {
                    x[i][0] = 1;
                    x[i][k] = col[i];
                }
            }
            return x;
        }
        double[] xs = ref.column("x");
        double[][] x = new double[xs.length][degree + 1];
        for (int i = 0; i < xs.length; i++) {
            double p = 1;
            for (int j = 0; j <= degree; j++) {
                x[i][j] = p;
                p *= xs[i];
            }
        }
        return x;
    }

    private static void assertDigits(String file, String what, double estimate, double certified, double minimumLre,
            double scale) {
        if (certified == 0) {
            assertThat(Math.abs(estimate)).as("%s %s (certified 0)", file, what).isLessThan(1e-7 * Math.max(1, scale));
        } else {
            assertThat(lre(estimate, certified)).as("%s %s: estimate %s vs certified %s", file, what, estimate, certified)
                    .isGreaterThanOrEqualTo(minimumLre);
        }
    }

    static double lre(double estimate, double certified) {
        double rel = Math.abs(estimate - certified) / Math.abs(certified);
        return rel == 0 ? 16 : -Math.log10(rel);
    }

    private static double maxAbs(double[] v) {
        double m = 0;
        for (double d : v) {
            m = Math.max(m, Math.abs(d));
        }
        return m;
    }
}
