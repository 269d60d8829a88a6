package dev.tallyvane.summary;

import jakarta.mail.MessagingException;
import jakarta.mail.internet.MimeMessage;
import java.math.BigDecimal;
import java.text.NumberFormat;
import java.time.format.DateTimeFormatter;
import java.util.Currency;
import java.util.Locale;
import org.springframework.context.MessageSource;
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
    private final MessageSource messages;

    SummaryMail(ITemplateEngine templates, JavaMailSender sender, SummaryProperties properties,
            MessageSource messages) {
        this.templates = templates;
        this.sender = sender;
        this.properties = properties;
        this.messages = messages;
    }

    /** A rendered e-mail. */
    record Rendered(String subject, String text, String html, byte[] chart) {
    }

    /** Formatting helpers the template calls ({@code fmt}). */
    static final class Formats {
        private final Locale locale;
        private final MessageSource messages;

        Formats(Locale locale, MessageSource messages) {
            this.locale = locale;
            this.messages = messages;
        }

        /** The e-mail's words: the message bundles in the e-mail's language ({@code tallyvane.summary.locale}). */
        String say(String key, Object... args) {
            return messages.getMessage(key, args, locale);
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

        /** "Q4 2026" (so written in English and German alike). */
        public String quarter(java.time.LocalDate d) {
            return d == null ? "" : "Q" + d.get(java.time.temporal.IsoFields.QUARTER_OF_YEAR) + " " + d.getYear();
        }

        /** A line's period in words: the month's name, the quarter, or nothing for a week. */
        public String period(WeeklySummary.Line l, java.time.LocalDate d) {
            return l.monthly() ? month(d) : l.quarterly() ? quarter(d) : "";
        }

        /** "next week", the month's name or the quarter, for the line's next period. */
        String next(WeeklySummary.Line l) {
            return l.weekly() ? say("mail.nextWeek") : period(l, l.nextPeriod());
        }
    }

    Rendered render(WeeklySummary summary, String recipientName, String unsubscribeUrl, String chartSrc) {
        return render(summary, recipientName, unsubscribeUrl, chartSrc, Locale.forLanguageTag(properties.locale()));
    }

    /** The same in the given language: its words from the bundles, its amounts and dates in its forms. */
    Rendered render(WeeklySummary summary, String recipientName, String unsubscribeUrl, String chartSrc, Locale locale) {
        Formats fmt = new Formats(locale, messages);
        String subject = fmt.say("mail.subject", fmt.day(summary.weekStart()), fmt.day(summary.weekEnd()));
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
        t.append(fmt.say("mail.hello", name)).append("\n\n");
        t.append(fmt.say("mail.t.week", fmt.day(s.weekStart()), fmt.day(s.weekEnd()))).append("\n\n");
        if (!s.hasFigures()) {
            t.append(fmt.say("mail.t.noFigures")).append("\n\n");
        }
        for (WeeklySummary.Line c : s.chain()) {
            t.append(fmt.say("mail.all")).append(c.weekly() ? "" : ", " + fmt.period(c, c.period())).append(": ");
            figures(t, fmt, c);
            t.append("; ").append(fmt.next(c)).append(" ");
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
            t.append("\n").append(fmt.say("mail.monthly")).append(":\n");
            for (WeeklySummary.Line l : s.monthly()) {
                location(t, fmt, l);
            }
        }
        if (!s.quarterly().isEmpty()) {
            t.append("\n").append(fmt.say("mail.quarterly")).append(":\n");
            for (WeeklySummary.Line l : s.quarterly()) {
                location(t, fmt, l);
            }
        }
        t.append("\n").append(fmt.say("mail.t.estimates")).append("\n");
        t.append(fmt.say("mail.t.dashboard", properties.dashboardUrl())).append("\n");
        t.append(fmt.say("mail.t.stop", unsubscribeUrl)).append("\n");
        return t.toString();
    }

    private static void location(StringBuilder t, Formats fmt, WeeklySummary.Line l) {
        t.append(l.code()).append(" ").append(l.name()).append(": ");
        if (!l.weekly()) {
            t.append(fmt.period(l, l.period())).append(" ");
        }
        if (l.actual() == null) {
            t.append(l.lastFigureOn() == null ? fmt.say("mail.t.noFiguresYet")
                    : fmt.say("mail.t.noFiguresSince", fmt.day(l.lastFigureOn())));
        } else {
            figures(t, fmt, l);
        }
        t.append("; ").append(fmt.next(l)).append(" ");
        range(t, fmt, l);
        for (String flag : l.flags()) {
            t.append("  ").append(fmt.say("mail.attention", flag)).append("\n");
        }
    }

    /** "actual €1,200.00, forecast €1,150.00, error €50.00 (+4.2%)" in the e-mail's words. */
    private static void figures(StringBuilder t, Formats fmt, WeeklySummary.Line l) {
        t.append(fmt.say("mail.t.figures", fmt.money(l.actual(), l.currency()), fmt.money(l.forecast(), l.currency()),
                fmt.money(l.error(), l.currency()), fmt.percent(l.errorPercent())));
    }

    private static void range(StringBuilder t, Formats fmt, WeeklySummary.Line l) {
        t.append(fmt.money(l.nextForecast(), l.currency()));
        if (l.nextForecast() != null) {
            t.append(" (").append(fmt.say("mail.t.range", fmt.money(l.nextLo80(), l.currency()),
                    fmt.money(l.nextHi80(), l.currency()))).append(")");
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
