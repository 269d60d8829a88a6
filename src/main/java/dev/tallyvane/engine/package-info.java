/**
 * The forecasting engine: plain Java and Apache Commons Math only (no Spring, JPA or servlet
 * types; {@code ArchitectureTests} proves it).
 *
 * <p>Entry point: {@link dev.tallyvane.engine.ForecastEngine#forecast}. Given a regular
 * {@link dev.tallyvane.engine.series.Series}, a horizon and a selection
 * {@link dev.tallyvane.engine.evaluation.Metric}, it fits every eligible candidate model,
 * scores each one on the same rolling origins, keeps the best, and returns its forecasts with
 * 80% and 95% intervals, its fitted values and the full leaderboard.
 */
package dev.tallyvane.engine;
