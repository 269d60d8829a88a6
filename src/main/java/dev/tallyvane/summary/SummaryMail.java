package dev.tallyvane.summary;

import jakarta.mail.MessagingException;
import jakarta.mail.internet.MimeMessage;
import java.math.BigDecimal;
import java.text.NumberFormat;
import java.time.format.DateTimeFormatter;
import java.util.Currency;
import java.util.Locale;
import org.springframework.core.io.ByteArrayResource;
import org.springframework.mail.javamail.JavaMailSender;
import org.springframework.mail.javamail.MimeMessageHelper;
import org.springframework.stereotype.Component;
import org.thymeleaf.ITemplateEngine;
import org.thymeleaf.context.Context;

/**
 * Renders a week's summary (HTML and plain text, the chart as a PNG) and sends it as one multipart
 * message: multipart/related holding multipart/alternative (text, HTML) and the chart referenced by
 * Content-ID "chart".
 */
@Component
class SummaryMail {

    private final ITemplateEngine templates;
    private final JavaMailSender sender;
    private final SummaryProperties properties;

    SummaryMail(ITemplateEngine templates, JavaMailSender sender, SummaryProperties properties) {
        this.templates = templates;
        this.sender = sender;
        this.properties = properties;
    }

    /** A rendered e-mail. */
    record Rendered(String subject, String text, String html, byte[] chart) {
    }

    /** Formatting helpers the template calls ({@code fmt}). */
    static final class Formats {
        private final Locale locale;

        Formats(Locale locale) {
            this.locale = locale;
        }

        public String money(BigDecimal amount, String currency) {
            if (amount == null) {
                return "–";
            }
            NumberFormat f = NumberFormat.getCurrencyInstance(locale);
            f.setCurrency(Currency.getInstance(currency));
            return f.format(amount);
        }

        public String percent(BigDecimal p) {
            return p == null ? "–" : (p.signum() > 0 ? "+" : "") + p.toPlainString() + "%";
        }

        public String day(java.time.LocalDate d) {
            return d == null ? "" : DateTimeFormatter.ofPattern("d MMM yyyy", locale).format(d);
        }

        public String month(java.time.LocalDate d) {
            return d == null ? "" : DateTimeFormatter.ofPattern("LLLL yyyy", locale).format(d);
        }

        /** "next week" or the month's name, for the line's next period. */
        String next(WeeklySummary.Line l) {
            return l.monthly() ? month(l.nextPeriod()) : "next week";
        }
    }

    Rendered render(WeeklySummary summary, String recipientName, String unsubscribeUrl, String chartSrc) {
        Locale locale = Locale.forLanguageTag(properties.locale());
        Formats fmt = new Formats(locale);
        String subject = "Tallyvane weekly summary: " + fmt.day(summary.weekStart()) + " – " + fmt.day(summary.weekEnd());
        Context context = new Context(locale);
        context.setVariable("s", summary);
        context.setVariable("fmt", fmt);
        context.setVariable("name", recipientName);
        context.setVariable("dashboard", properties.dashboardUrl());
        context.setVariable("unsubscribe", unsubscribeUrl);
        context.setVariable("chartSrc", chartSrc);
        context.setVariable("subject", subject);
        String html = templates.process("summary/weekly-mail", context);
        return new Rendered(subject, text(summary, fmt, recipientName, unsubscribeUrl), html,
                SummaryChart.png(summary.chart()));
    }

    private String text(WeeklySummary s, Formats fmt, String name, String unsubscribeUrl) {
        StringBuilder t = new StringBuilder();
        t.append("Hello ").append(name).append(",\n\n");
        t.append("Week ").append(fmt.day(s.weekStart())).append(" – ").append(fmt.day(s.weekEnd())).append("\n\n");
        if (!s.hasFigures()) {
            t.append("No figures arrived for this week. Tallyvane will catch up as soon as they do.\n\n");
        }
        for (WeeklySummary.Line c : s.chain()) {
            t.append("All locations").append(c.monthly() ? ", " + fmt.month(c.period()) : "").append(": actual ")
                    .append(fmt.money(c.actual(), c.currency())).append(", forecast ")
                    .append(fmt.money(c.forecast(), c.currency())).append(", error ").append(fmt.money(c.error(), c.currency()))
                    .append(" (").append(fmt.percent(c.errorPercent())).append("); ").append(fmt.next(c)).append(" ");
            range(t, fmt, c);
            if (!c.note().isEmpty()) {
                t.append("  ").append(c.note()).append("\n");
            }
        }
        t.append("\n");
        for (WeeklySummary.Line l : s.locations()) {
            location(t, fmt, l);
        }
        if (!s.monthly().isEmpty()) {
            t.append("\nLocations reporting by the month:\n");
            for (WeeklySummary.Line l : s.monthly()) {
                location(t, fmt, l);
            }
        }
        t.append("\nForecasts are estimates, not guarantees: the 80% range is where the figure will likely fall.\n");
        t.append("Dashboard: ").append(properties.dashboardUrl()).append("\n");
        t.append("Stop these e-mails: ").append(unsubscribeUrl).append("\n");
        return t.toString();
    }

    private static void location(StringBuilder t, Formats fmt, WeeklySummary.Line l) {
        t.append(l.code()).append(" ").append(l.name()).append(": ");
        if (l.monthly()) {
            t.append(fmt.month(l.period())).append(" ");
        }
        if (l.actual() == null) {
            t.append(l.lastFigureOn() == null ? "no figures yet" : "no figures since " + fmt.day(l.lastFigureOn()));
        } else {
            t.append("actual ").append(fmt.money(l.actual(), l.currency())).append(", forecast ")
                    .append(fmt.money(l.forecast(), l.currency())).append(", error ")
                    .append(fmt.money(l.error(), l.currency())).append(" (").append(fmt.percent(l.errorPercent()))
                    .append(")");
        }
        t.append("; ").append(fmt.next(l)).append(" ");
        range(t, fmt, l);
        for (String flag : l.flags()) {
            t.append("  Needs attention: ").append(flag).append("\n");
        }
    }

    private static void range(StringBuilder t, Formats fmt, WeeklySummary.Line l) {
        t.append(fmt.money(l.nextForecast(), l.currency()));
        if (l.nextForecast() != null) {
            t.append(" (80% range ").append(fmt.money(l.nextLo80(), l.currency())).append(" – ")
                    .append(fmt.money(l.nextHi80(), l.currency())).append(")");
        }
        t.append("\n");
    }

    void send(String to, Rendered mail, String unsubscribeUrl) throws MessagingException {
        MimeMessage message = sender.createMimeMessage();
        MimeMessageHelper helper = new MimeMessageHelper(message, MimeMessageHelper.MULTIPART_MODE_MIXED_RELATED, "UTF-8");
        helper.setFrom(properties.from());
        helper.setTo(to);
        helper.setSubject(mail.subject());
        helper.setText(mail.text(), mail.html());
        helper.addInline("chart", new ByteArrayResource(mail.chart()), "image/png");
        message.setHeader("List-Unsubscribe", "<" + unsubscribeUrl + ">");
        sender.send(message);
    }
}
