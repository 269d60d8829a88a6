package dev.tallyvane.intake.upload;

import dev.tallyvane.account.AuditLog;
import dev.tallyvane.engine.series.Granularity;
import dev.tallyvane.intake.FigureInput;
import dev.tallyvane.intake.IntakeResult;
import dev.tallyvane.intake.IntakeService;
import dev.tallyvane.intake.Submitter;
import dev.tallyvane.intake.internal.FigureStore;
import dev.tallyvane.location.Location;
import dev.tallyvane.location.LocationDetails;
import dev.tallyvane.location.LocationService;
import dev.tallyvane.system.InvalidRequest;
import dev.tallyvane.system.InvalidRequest.FieldProblem;
import dev.tallyvane.system.TallyvaneProperties;
import java.time.Clock;
import java.time.LocalDate;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Set;
import java.util.TreeSet;
import java.util.stream.Collectors;
import org.springframework.stereotype.Service;
import org.springframework.transaction.annotation.Transactional;

/**
 * The bookkeeper's upload: the file is stored as sent, shown as a preview (new, changed and
 * unchanged figures per location, every rejected row), and committed in one transaction, creating
 * the unknown locations only when the user confirmed it.
 */
@Service
public class UploadService {

    /** Control characters never reach the database: a file name or type is stored without them. */
    private static final java.util.regex.Pattern CONTROL = java.util.regex.Pattern.compile("[\\p{Cntrl}]");

    private final UploadStore store;
    private final FigureStore figures;
    private final IntakeService intake;
    private final LocationService locations;
    private final AuditLog audit;
    private final TallyvaneProperties properties;
    private final Clock clock;

    UploadService(UploadStore store, FigureStore figures, IntakeService intake, LocationService locations,
            AuditLog audit, TallyvaneProperties properties, Clock clock) {
        this.store = store;
        this.figures = figures;
        this.intake = intake;
        this.locations = locations;
        this.audit = audit;
        this.properties = properties;
        this.clock = clock;
    }

    /**
     * What the preview shows.
     *
     * @param problems         every rejected row with its field and reason (row numbers as in the file)
     * @param unknownLocations codes in the file that no location has
     * @param outcome          new / changed / unchanged per location, for the rows that are fine
     * @param needsDateOrder   the user must say whether dates are day/month or month/day
     * @param needsNumberStyle the user must say which mark separates decimals
     * @param dateOrderMatters the file writes dates such as 03/04/2026, whose reading depends on the order
     * @param covers           the periods the file's good rows cover, per granularity
     * @param overlaps         months where monthly totals and daily figures of a location would sit side by side
     */
    public record Preview(Upload upload, int rowCount, List<FieldProblem> problems, Set<String> unknownLocations,
            IntakeResult outcome, boolean needsDateOrder, boolean needsNumberStyle, UploadOptions usedOptions,
            boolean dateOrderMatters, List<Coverage> covers, List<Overlap> overlaps) {

        public boolean canCommit() {
            return upload.staged() && problems.isEmpty() && !needsDateOrder && !needsNumberStyle
                    && outcome.received() > 0;
        }

        public long rejectedRows() {
            return problems.stream().map(FieldProblem::index).distinct().count();
        }
    }

    /**
     * The periods a file covers at one granularity.
     *
     * @param unit      "day", "week" or "month"
     * @param periods   how many distinct periods
     * @param locations how many locations
     */
    public record Coverage(String unit, String first, String last, int periods, int locations) {
    }

    /**
     * Months of one location and measure that would hold both a monthly total and daily figures
     * after the commit, and which of them each forecast reads.
     *
     * @param monthlyInFile true when the file brings the monthly totals (the days are already kept),
     *                      false when it brings the days (the monthly totals are already kept)
     */
    public record Overlap(String location, String measure, List<String> months, boolean monthlyInFile) {

        /** What the forecast uses, in words (see {@code SeriesReader} and the forecast's default granularity). */
        public String effect() {
            return "The weekly forecast (the default where daily figures exist) is built from the daily figures; "
                    + "the monthly view and any monthly forecast use the monthly total instead of the sum of the days.";
        }
    }

    /**
     * Stores a file for preview.
     *
     * @throws UploadRejected when the file as a whole cannot be read (nothing is stored then)
     */
    @Transactional
    public long stage(String fileName, String contentType, byte[] content, String user) {
        String name = fileName == null ? "" : CONTROL.matcher(fileName).replaceAll("").strip();
        if (name.isEmpty()) {
            name = "upload";
        }
        if (name.length() > 255) {
            name = name.substring(0, 255);
        }
        contentType = contentType == null ? null : CONTROL.matcher(contentType).replaceAll("");
        if (contentType != null && contentType.length() > 100) {
            contentType = contentType.substring(0, 100);
        }
        if (content.length == 0) {
            throw new UploadRejected("The file is empty.");
        }
        RawTable table = read(name, content);
        UploadParser.Parsed parsed = UploadParser.parse(table, UploadOptions.AUTO);
        long id = store.insert(name, contentType, content, user, clock.instant(), UploadOptions.AUTO);
        keepPreviewCounts(id);
        audit.record(user, "UPLOAD_STAGED", "#" + id + " " + name + ", " + parsed.rowCount() + " rows");
        return id;
    }

    @Transactional(readOnly = true)
    public Upload upload(long id) {
        return store.find(id).orElseThrow(() -> new UnknownUpload(id));
    }

    @Transactional(readOnly = true)
    public List<Upload> history(int limit) {
        return store.latest(limit);
    }

    @Transactional(readOnly = true)
    public Preview preview(long id) {
        Upload upload = upload(id);
        UploadParser.Parsed parsed = UploadParser.parse(read(upload.fileName(), store.content(id)), upload.options());
        Set<String> unknown = unknownCodes(parsed.figures());
        List<FieldProblem> problems = new ArrayList<>(parsed.problems());
        problems.addAll(intake.check(parsed.figures(), unknown, "row"));
        problems.sort(java.util.Comparator.comparing(FieldProblem::index));
        List<FigureInput> clean = withoutRows(parsed.figures(), problems);
        return new Preview(upload, parsed.rowCount(), problems, unknown, intake.preview(clean), parsed.needsDateOrder(),
                parsed.needsNumberStyle(), parsed.usedOptions(), parsed.dateOrderMatters(), coverage(clean),
                overlaps(clean));
    }

    /**
     * The history's counts of a staged upload are its preview's (rows, rejected rows, new, changed,
     * unchanged), kept again whenever the reading options change; a commit replaces them with what
     * was saved.
     */
    private void keepPreviewCounts(long id) {
        Preview p = preview(id);
        store.updateCounts(id, p.rowCount(), (int) p.rejectedRows(), p.outcome().created(), p.outcome().changed(),
                p.outcome().unchanged());
    }

    private static List<Coverage> coverage(List<FigureInput> clean) {
        List<Coverage> out = new ArrayList<>();
        for (Granularity g : Granularity.values()) {
            java.util.TreeSet<LocalDate> periods = new java.util.TreeSet<>();
            Set<String> codes = new java.util.HashSet<>();
            for (FigureInput f : clean) {
                if (f.granularity() == g) {
                    periods.add(f.periodStart());
                    codes.add(f.locationCode());
                }
            }
            if (!periods.isEmpty()) {
                out.add(new Coverage(g.name().toLowerCase(Locale.ROOT), g.label(periods.first()), g.label(periods.last()),
                        periods.size(), codes.size()));
            }
        }
        return out;
    }

    /**
     * Months where the file's monthly totals meet daily figures already kept for the same location
     * and measure, or the file's daily figures meet kept monthly totals. (A file that mixes the two
     * itself is refused by the parser.)
     */
    private List<Overlap> overlaps(List<FigureInput> clean) {
        record Series(String code, String measure, Granularity granularity) {
        }
        java.util.Map<Series, java.util.TreeSet<LocalDate>> months = new java.util.TreeMap<>(
                java.util.Comparator.comparing(Series::code).thenComparing(Series::measure)
                        .thenComparing(Series::granularity));
        for (FigureInput f : clean) {
            if (f.granularity() == Granularity.DAY || f.granularity() == Granularity.MONTH) {
                months.computeIfAbsent(new Series(f.locationCode(), f.measure(), f.granularity()),
                        k -> new java.util.TreeSet<>()).add(f.periodStart().withDayOfMonth(1));
            }
        }
        if (months.isEmpty()) {
            return List.of();
        }
        java.util.Map<String, Long> ids = locations.byCodes(months.keySet().stream().map(Series::code)
                .collect(Collectors.toSet())).stream().collect(Collectors.toMap(Location::getCode, Location::getId));
        List<Overlap> out = new ArrayList<>();
        months.forEach((series, inFile) -> {
            Long id = ids.get(series.code());
            if (id == null) {
                return;
            }
            Granularity other = series.granularity() == Granularity.DAY ? Granularity.MONTH : Granularity.DAY;
            java.util.TreeSet<LocalDate> kept = new java.util.TreeSet<>();
            for (FigureStore.Stored s : figures.read(id, series.measure(), Set.of(other), null, inFile.first(),
                    inFile.last().plusMonths(1).minusDays(1))) {
                kept.add(s.periodStart().withDayOfMonth(1));
            }
            kept.retainAll(inFile);
            if (!kept.isEmpty()) {
                out.add(new Overlap(series.code(), series.measure(),
                        kept.stream().map(Granularity.MONTH::label).toList(), series.granularity() == Granularity.MONTH));
            }
        });
        return out;
    }

    @Transactional
    public void changeOptions(long id, UploadOptions options) {
        Upload upload = upload(id);
        if (!upload.staged()) {
            throw new UploadAlreadyFinished(id, upload.status());
        }
        store.updateOptions(id, options);
        keepPreviewCounts(id);
    }

    /**
     * Commits the upload: all figures or none.
     *
     * @param createLocations the user confirmed that the unknown locations are to be created
     * @throws InvalidRequest when rows are rejected, the reading is ambiguous or unknown locations were not confirmed
     */
    @Transactional
    public IntakeResult commit(long id, boolean createLocations, String user) {
        Upload upload = upload(id);
        if (!store.finish(id, Upload.Status.COMMITTED, clock.instant(), user)) {
            throw new UploadAlreadyFinished(id, upload(id).status());
        }
        UploadParser.Parsed parsed = UploadParser.parse(read(upload.fileName(), store.content(id)), upload.options());
        if (parsed.needsDateOrder() || parsed.needsNumberStyle()) {
            throw new InvalidRequest("options", "say how dates and amounts are written before committing");
        }
        if (!parsed.problems().isEmpty()) {
            throw new InvalidRequest("Some rows are rejected; fix the file and upload it again.", parsed.problems());
        }
        if (parsed.figures().isEmpty()) {
            throw new InvalidRequest("file", "the file holds no figures to save (no rows with a location, a period "
                    + "and an amount)");
        }
        Set<String> unknown = unknownCodes(parsed.figures());
        if (!unknown.isEmpty()) {
            if (!createLocations) {
                throw new InvalidRequest("location", "the file names locations that do not exist yet ("
                        + String.join(", ", unknown) + "); tick \"create them\" to add them");
            }
            createLike(unknown, user);
        }
        IntakeResult result = intake.record(parsed.figures(), Submitter.upload(user, id), "row");
        store.updateCounts(id, parsed.rowCount(), 0, result.created(), result.changed(), result.unchanged());
        audit.record(user, "UPLOAD_COMMITTED", "#" + id + " " + upload.fileName() + ": " + result.created() + " new, "
                + result.changed() + " changed, " + result.unchanged() + " unchanged");
        return result;
    }

    @Transactional
    public void discard(long id, String user) {
        Upload upload = upload(id);
        if (!store.finish(id, Upload.Status.DISCARDED, clock.instant(), user)) {
            throw new UploadAlreadyFinished(id, upload.status());
        }
        audit.record(user, "UPLOAD_DISCARDED", "#" + id + " " + upload.fileName());
    }

    private void createLike(Set<String> codes, String user) {
        List<Location> existing = locations.all();
        String zone = existing.isEmpty() ? properties.defaults().timeZone() : existing.get(0).getTimeZone();
        String currency = existing.isEmpty() ? properties.defaults().currency() : existing.get(0).getCurrency();
        for (String code : codes) {
            locations.create(new LocationDetails(code, code, zone, currency, null, null), user);
        }
    }

    private Set<String> unknownCodes(List<FigureInput> figures) {
        Set<String> codes = figures.stream().map(FigureInput::locationCode).collect(Collectors.toCollection(TreeSet::new));
        Set<String> known = locations.all().stream().map(Location::getCode).collect(Collectors.toSet());
        codes.removeAll(known);
        return codes;
    }

    private static List<FigureInput> withoutRows(List<FigureInput> figures, List<FieldProblem> problems) {
        Set<Integer> bad = problems.stream().map(FieldProblem::index).collect(Collectors.toSet());
        return figures.stream().filter(f -> !bad.contains(f.index())).toList();
    }

    private RawTable read(String fileName, byte[] content) {
        int max = properties.intake().maxUploadRows();
        boolean zip = content.length >= 4 && content[0] == 'P' && content[1] == 'K';
        boolean ole = content.length >= 4 && (content[0] & 0xFF) == 0xD0 && (content[1] & 0xFF) == 0xCF;
        String lower = fileName.toLowerCase(Locale.ROOT);
        if (zip || ole || lower.endsWith(".xlsx") || lower.endsWith(".xls")) {
            return XlsxTableReader.read(content, max);
        }
        return CsvTableReader.read(content, max);
    }
}
