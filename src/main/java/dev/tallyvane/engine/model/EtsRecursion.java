package dev.tallyvane.engine.model;

/**
 * The ETS state-space recursion (error-correction form) for one set of parameters and initial
 * states. With q_t = ℓ_{t−1} + φb_{t−1} (φ = 1 for an undamped trend; b ≡ 0 without a trend),
 * the one-step forecast is μ_t = q_t, q_t + s_{t−m}, or q_t·s_{t−m} (no, additive, multiplicative
 * season), and with r_t = y_t − μ_t:
 * <pre>
 *   additive season:        ℓ_t = q_t + α r_t,        b_t = φb_{t−1} + β r_t,        s_t = s_{t−m} + γ r_t
 *   multiplicative season:  ℓ_t = q_t + α r_t/s_{t−m}, b_t = φb_{t−1} + β r_t/s_{t−m}, s_t = s_{t−m} + γ r_t/q_t
 * </pre>
 * These are the updates of Hyndman et al. (2008), Table 2.2/2.3, written in r_t: the additive-
 * and multiplicative-error models share them (ε_t = r_t or r_t/μ_t), and differ only in the
 * likelihood. β here is the error-correction β = α·β* of Holt's form (β* is the handbook's γ).
 */
final class EtsRecursion {

    private EtsRecursion() {
    }

    /** Smoothing parameters; β, γ, φ are ignored where the form lacks them. */
    record Parameters(double alpha, double beta, double gamma, double phi) {
    }

    /**
     * The states at time 0: level ℓ₀, trend b₀ and the m seasonal states s_{1−m}..s₀
     * (seasons[j] is the state used for periods j, j + m, …).
     */
    record States(double level, double trend, double[] seasons) {
    }

    /**
     * Result of one pass.
     *
     * @param fitted one-step forecasts μ_t
     * @param sse Σ r_t² (additive errors) or Σ (r_t/μ_t)² (multiplicative errors)
     * @param sumLogMu Σ log|μ_t| (for the multiplicative-error likelihood)
     * @param finalStates the states after the last observation
     * @param valid false when a multiplicative form met a non-positive μ or a state went non-finite
     */
    record Pass(double[] fitted, double sse, double sumLogMu, States finalStates, boolean valid) {
    }

    static Pass run(EtsForm form, Parameters p, States initial, double[] y, int m) {
        int n = y.length;
        double level = initial.level();
        double trend = form.hasTrend() ? initial.trend() : 0;
        double phi = form.damped() ? p.phi() : (form.hasTrend() ? 1 : 0);
        double[] seasons = initial.seasons() == null ? null : initial.seasons().clone();
        double[] fitted = new double[n];
        double sse = 0;
        double sumLogMu = 0;
        boolean multiplicativeError = form.error() == EtsForm.Error.M;
        boolean valid = true;
        for (int t = 0; t < n; t++) {
            double q = level + phi * trend;
            double s = 0;
            double mu;
            switch (form.season()) {
                case A -> {
                    s = seasons[t % m];
                    mu = q + s;
                }
                case M -> {
                    s = seasons[t % m];
                    mu = q * s;
                }
                default -> mu = q;
            }
            fitted[t] = mu;
            double r = y[t] - mu;
            if (multiplicativeError) {
                if (!(mu > 0)) {
                    valid = false;
                    break;
                }
                double e = r / mu;
                sse += e * e;
                sumLogMu += Math.log(mu);
            } else {
                sse += r * r;
            }
            if (form.season() == EtsForm.Season.M) {
                level = q + p.alpha() * r / s;
                trend = phi * trend + p.beta() * r / s;
                seasons[t % m] = s + p.gamma() * r / q;
            } else {
                level = q + p.alpha() * r;
                trend = phi * trend + p.beta() * r;
                if (form.season() == EtsForm.Season.A) {
                    seasons[t % m] = s + p.gamma() * r;
                }
            }
            if (!Double.isFinite(level) || !Double.isFinite(trend)) {
                valid = false;
                break;
            }
        }
        return new Pass(fitted, sse, sumLogMu, new States(level, trend, seasons), valid && Double.isFinite(sse));
    }

    /**
     * Point forecasts from the states after observation n (0-based count), per Hyndman et al.
     * (2008) Table 2.1: ŷ_{n+h} = (ℓ + φ_h b) ⊕ s_{n+h−m(k+1)}, φ_h = φ + … + φ^h.
     */
    static double[] pointForecasts(EtsForm form, Parameters p, States states, int n, int m, int horizon) {
        double phi = form.damped() ? p.phi() : 1;
        double[] out = new double[horizon];
        double phiSum = 0;
        double phiPower = 1;
        for (int h = 1; h <= horizon; h++) {
            phiPower *= phi;
            phiSum += phiPower;
            double base = states.level() + (form.hasTrend() ? phiSum * states.trend() : 0);
            int seasonIndex = (n - 1 + h) % m;
            out[h - 1] = switch (form.season()) {
                case A -> base + states.seasons()[seasonIndex];
                case M -> base * states.seasons()[seasonIndex];
                default -> base;
            };
        }
        return out;
    }
}
