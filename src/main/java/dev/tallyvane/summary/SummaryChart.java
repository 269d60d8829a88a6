package dev.tallyvane.summary;

import java.awt.BasicStroke;
import java.awt.Color;
import java.awt.Font;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.time.LocalDate;
import java.time.ZoneOffset;
import java.util.Date;
import org.jfree.chart.ChartUtils;
import org.jfree.chart.JFreeChart;
import org.jfree.chart.axis.DateAxis;
import org.jfree.chart.axis.NumberAxis;
import org.jfree.chart.plot.XYPlot;
import org.jfree.chart.renderer.xy.DeviationRenderer;
import org.jfree.chart.renderer.xy.XYLineAndShapeRenderer;
import org.jfree.data.xy.XYSeries;
import org.jfree.data.xy.XYSeriesCollection;
import org.jfree.data.xy.YIntervalSeries;
import org.jfree.data.xy.YIntervalSeriesCollection;

/**
 * The e-mail's chart, drawn on the server as a PNG (e-mail clients run no scripts and show SVG
 * unreliably): the chain's weekly actuals, the forecast ahead and its 80% band.
 */
final class SummaryChart {

    static final int WIDTH = 640;
    static final int HEIGHT = 260;

    private SummaryChart() {
    }

    static byte[] png(WeeklySummary.Chart data) {
        XYSeries actual = new XYSeries("Actual");
        for (int i = 0; i < data.actualWeeks().size(); i++) {
            actual.add(millis(data.actualWeeks().get(i)), data.actuals().get(i));
        }
        YIntervalSeries forecast = new YIntervalSeries("Forecast with 80% range");
        for (int i = 0; i < data.forecastWeeks().size(); i++) {
            forecast.add(millis(data.forecastWeeks().get(i)), data.forecasts().get(i), data.lo80().get(i), data.hi80().get(i));
        }
        XYPlot plot = new XYPlot();
        DateAxis weeks = new DateAxis();
        weeks.setTimeZone(java.util.TimeZone.getTimeZone("UTC"));
        plot.setDomainAxis(weeks);
        NumberAxis values = new NumberAxis(data.currency() == null ? "" : data.currency());
        values.setAutoRangeIncludesZero(false);
        plot.setRangeAxis(values);
        XYLineAndShapeRenderer lines = new XYLineAndShapeRenderer(true, true);
        lines.setSeriesPaint(0, new Color(0x1d, 0x24, 0x30));
        lines.setSeriesStroke(0, new BasicStroke(2f));
        plot.setDataset(0, new XYSeriesCollection(actual));
        plot.setRenderer(0, lines);
        DeviationRenderer band = new DeviationRenderer(true, false);
        band.setSeriesPaint(0, new Color(0x1f, 0x5f, 0x8b));
        band.setSeriesFillPaint(0, new Color(0x1f, 0x5f, 0x8b));
        band.setSeriesStroke(0, new BasicStroke(2f, BasicStroke.CAP_ROUND, BasicStroke.JOIN_ROUND, 1f,
                new float[] {6f, 4f}, 0f));
        band.setAlpha(0.2f);
        YIntervalSeriesCollection ahead = new YIntervalSeriesCollection();
        ahead.addSeries(forecast);
        plot.setDataset(1, ahead);
        plot.setRenderer(1, band);
        plot.setBackgroundPaint(Color.WHITE);
        plot.setRangeGridlinePaint(new Color(0xd7, 0xdc, 0xe3));
        plot.setDomainGridlinePaint(new Color(0xd7, 0xdc, 0xe3));
        JFreeChart chart = new JFreeChart("All locations, net sales per week", new Font("SansSerif", Font.BOLD, 14),
                plot, true);
        chart.setBackgroundPaint(Color.WHITE);
        try (ByteArrayOutputStream out = new ByteArrayOutputStream()) {
            ChartUtils.writeChartAsPNG(out, chart, WIDTH, HEIGHT);
            return out.toByteArray();
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    private static double millis(LocalDate d) {
        return Date.from(d.atStartOfDay(ZoneOffset.UTC).toInstant()).getTime();
    }
}
