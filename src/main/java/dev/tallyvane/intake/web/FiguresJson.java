package dev.tallyvane.intake.web;

import dev.tallyvane.engine.series.Granularity;
import dev.tallyvane.intake.FigureInput;
import dev.tallyvane.intake.FigureRules;
import dev.tallyvane.location.LocationService;
import dev.tallyvane.system.InvalidRequest;
import dev.tallyvane.system.InvalidRequest.FieldProblem;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Set;
import tools.jackson.core.JacksonException;
import tools.jackson.core.StreamReadConstraints;
import tools.jackson.core.json.JsonFactory;
import tools.jackson.databind.DeserializationFeature;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;

/**
 * Reads the body of {@code POST /api/v1/figures}:
 * <pre>{"figures": [{"location": "HARBOUR", "period": "2026-11-30", "measure": "net_sales", "amount": 1234.50}]}</pre>
 * Every item is checked for shape (types, required fields, unknown fields) and every problem is
 * collected with its item index; amounts are read as exact decimals.
 */
final class FiguresJson {

    private static final Set<String> FIELDS = Set.of("location", "period", "measure", "amount");
    private static final JsonMapper MAPPER = JsonMapper.builder(JsonFactory.builder()
                    .streamReadConstraints(StreamReadConstraints.builder().maxNestingDepth(64)
                            .maxStringLength(10_000).build()).build())
            .enable(DeserializationFeature.USE_BIG_DECIMAL_FOR_FLOATS)
            .enable(DeserializationFeature.FAIL_ON_TRAILING_TOKENS)
            .build();

    private FiguresJson() {
    }

    /** Parsed items and the shape problems found (item index, field, reason). */
    record Parsed(List<FigureInput> figures, List<FieldProblem> problems) {
    }

    /** Thrown for a body that is not JSON at all. */
    static final class Malformed extends RuntimeException {
        Malformed(String message) {
            super(message);
        }
    }

    static Parsed parse(byte[] body, int maxFigures) {
        JsonNode root;
        try {
            root = MAPPER.readTree(body);
        } catch (JacksonException e) {
            // our words, with where: the parser's own message quotes its internals
            var at = e.getLocation();
            String where = at != null && at.getLineNr() > 0 ? " near line " + at.getLineNr() + ", column "
                    + at.getColumnNr() : "";
            String why = e instanceof tools.jackson.core.exc.StreamConstraintsException
                    ? "it is nested too deeply or holds a value that is too long" : "it is not valid JSON";
            throw new Malformed("The body could not be read" + where + ": " + why + ".");
        }
        if (root == null || !root.isObject() || !root.has("figures") || !root.get("figures").isArray()) {
            throw new InvalidRequest("figures", "the body must be an object with a 'figures' array");
        }
        for (String name : root.propertyNames()) {
            if (!name.equals("figures")) {
                throw new InvalidRequest(name, "unknown field '" + name + "'; the body has only 'figures'");
            }
        }
        JsonNode items = root.get("figures");
        if (items.size() == 0) {
            throw new InvalidRequest("figures", "the 'figures' array is empty");
        }
        if (items.size() > maxFigures) {
            throw new InvalidRequest("figures", "at most " + maxFigures + " figures per request, got " + items.size()
                    + "; split the post");
        }
        List<FigureInput> figures = new ArrayList<>(items.size());
        List<FieldProblem> problems = new ArrayList<>();
        for (int i = 0; i < items.size(); i++) {
            JsonNode item = items.get(i);
            if (!item.isObject()) {
                problems.add(new FieldProblem(i, "figures", "each figure must be an object"));
                continue;
            }
            int before = problems.size();
            for (Map.Entry<String, JsonNode> e : item.properties()) {
                if (!FIELDS.contains(e.getKey())) {
                    problems.add(new FieldProblem(i, e.getKey(), "unknown field '" + e.getKey()
                            + "'; use location, period, measure, amount"));
                }
            }
            String location = text(item, "location", i, problems, true);
            String periodText = text(item, "period", i, problems, true);
            String measure = text(item, "measure", i, problems, false);
            Granularity granularity = null;
            java.time.LocalDate period = null;
            if (periodText != null) {
                try {
                    granularity = Granularity.ofLabel(periodText);
                    period = granularity.parse(periodText);
                } catch (IllegalArgumentException e) {
                    problems.add(new FieldProblem(i, "period", e.getMessage()));
                }
            }
            JsonNode amountNode = item.get("amount");
            java.math.BigDecimal amount = null;
            if (amountNode == null || amountNode.isNull()) {
                problems.add(new FieldProblem(i, "amount", "amount is required"));
            } else if (!amountNode.isNumber()) {
                problems.add(new FieldProblem(i, "amount", "amount must be a JSON number, got "
                        + amountNode.getNodeType().name().toLowerCase(java.util.Locale.ROOT)));
            } else {
                amount = amountNode.decimalValue();
            }
            if (problems.size() == before) {
                figures.add(new FigureInput(i, LocationService.normaliseCode(location),
                        measure == null ? FigureRules.DEFAULT_MEASURE : measure, granularity, period, amount));
            }
        }
        return new Parsed(figures, problems);
    }

    private static String text(JsonNode item, String field, int i, List<FieldProblem> problems, boolean required) {
        JsonNode n = item.get(field);
        if (n == null || n.isNull()) {
            if (required) {
                problems.add(new FieldProblem(i, field, field + " is required"));
            }
            return null;
        }
        if (!n.isString()) {
            problems.add(new FieldProblem(i, field, field + " must be a string"));
            return null;
        }
        String unprintable = FigureRules.unprintable(n.asString()); // before trim(), which drops U+0000 too
        String s = n.asString().trim();
        if (unprintable != null) {
            problems.add(new FieldProblem(i, field, field + " " + unprintable));
            return null;
        }
        if (s.isEmpty()) {
            problems.add(new FieldProblem(i, field, field + " is empty"));
            return null;
        }
        return s;
    }
}
