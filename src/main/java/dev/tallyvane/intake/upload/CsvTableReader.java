package dev.tallyvane.intake.upload;

import java.io.IOException;
import java.io.Reader;
import java.io.UncheckedIOException;
import java.nio.ByteBuffer;
import java.nio.charset.CharacterCodingException;
import java.nio.charset.CodingErrorAction;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.apache.commons.csv.CSVFormat;
import org.apache.commons.csv.CSVParser;
import org.apache.commons.csv.CSVRecord;

/**
 * Reads a CSV upload: UTF-8 (a byte-order mark is skipped; invalid UTF-8 is refused, naming the
 * byte offset), separator ',', ';' or tab detected from the header line, RFC 4180 quoting.
 */
final class CsvTableReader {

    private CsvTableReader() {
    }

    static RawTable read(byte[] content, int maxRows) {
        String text = decode(content);
        if (text.startsWith("\uFEFF")) {
            text = text.substring(1);
        }
        if (text.isBlank()) {
            throw new UploadRejected("The file is empty.");
        }
        String firstLine = text.lines().findFirst().orElse("");
        char delimiter = firstLine.contains(";") && !firstLine.contains(",") ? ';'
                : firstLine.contains("\t") && !firstLine.contains(",") ? '\t' : ',';
        CSVFormat format = CSVFormat.RFC4180.builder().setDelimiter(delimiter).setIgnoreEmptyLines(true)
                .setIgnoreSurroundingSpaces(true).get();
        List<String> header = null;
        List<RawTable.Row> rows = new ArrayList<>();
        try (Reader reader = new java.io.StringReader(text); CSVParser parser = format.parse(reader)) {
            for (CSVRecord record : parser) {
                int line = (int) parser.getCurrentLineNumber();
                if (header == null) {
                    header = new ArrayList<>();
                    for (String h : record) {
                        header.add(h.trim().toLowerCase(Locale.ROOT));
                    }
                    continue;
                }
                if (rows.size() >= maxRows) {
                    throw new UploadRejected("The file has more than " + maxRows + " data rows; split it into "
                            + "smaller files (for example one per month).");
                }
                Map<String, RawValue> cells = new LinkedHashMap<>();
                for (int i = 0; i < record.size() && i < header.size(); i++) {
                    cells.put(header.get(i), new RawValue.Text(record.get(i)));
                }
                if (record.size() > header.size()) {
                    cells.put("#extra", new RawValue.Text(record.size() + " fields, header has " + header.size()));
                }
                rows.add(new RawTable.Row(line, cells));
            }
        } catch (IOException | UncheckedIOException | IllegalStateException e) {
            throw new UploadRejected("The file is not a readable CSV: " + e.getMessage());
        }
        if (header == null) {
            throw new UploadRejected("The file is empty.");
        }
        return new RawTable(header, rows);
    }

    private static String decode(byte[] content) {
        try {
            return StandardCharsets.UTF_8.newDecoder().onMalformedInput(CodingErrorAction.REPORT)
                    .onUnmappableCharacter(CodingErrorAction.REPORT).decode(ByteBuffer.wrap(content)).toString();
        } catch (CharacterCodingException e) {
            int offset = firstInvalidOffset(content);
            throw new UploadRejected("The file is not valid UTF-8 text (first bad byte at offset " + offset
                    + "). Save it as \"CSV UTF-8\" and upload again.");
        }
    }

    private static int firstInvalidOffset(byte[] content) {
        var decoder = StandardCharsets.UTF_8.newDecoder().onMalformedInput(CodingErrorAction.REPORT);
        ByteBuffer in = ByteBuffer.wrap(content);
        var out = java.nio.CharBuffer.allocate(content.length + 1);
        var result = decoder.decode(in, out, true);
        return result.isError() ? in.position() : -1;
    }
}
