package dev.tallyvane.intake.upload;

import java.io.ByteArrayInputStream;
import java.io.IOException;
import java.io.InputStream;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.TreeMap;
import org.apache.poi.EncryptedDocumentException;
import org.apache.poi.ooxml.util.SAXHelper;
import org.apache.poi.openxml4j.exceptions.InvalidFormatException;
import org.apache.poi.openxml4j.exceptions.NotOfficeXmlFileException;
import org.apache.poi.openxml4j.exceptions.OLE2NotOfficeXmlFileException;
import org.apache.poi.openxml4j.exceptions.OpenXML4JException;
import org.apache.poi.openxml4j.opc.OPCPackage;
import org.apache.poi.poifs.filesystem.FileMagic;
import org.apache.poi.ss.usermodel.DateUtil;
import org.apache.poi.xssf.eventusermodel.ReadOnlySharedStringsTable;
import org.apache.poi.xssf.eventusermodel.XSSFReader;
import org.apache.poi.xssf.model.StylesTable;
import org.apache.poi.xssf.usermodel.XSSFCellStyle;
import org.xml.sax.Attributes;
import org.xml.sax.InputSource;
import org.xml.sax.SAXException;
import org.xml.sax.XMLReader;
import org.xml.sax.helpers.DefaultHandler;

/**
 * Reads an XLSX upload with POI's streaming (SAX) reader, so a large sheet is never held as a
 * workbook object graph. One sheet only; formula cells, dates and numbers are reported as what
 * they are ({@link RawValue}). Password-protected files (an encrypted OLE2 container), old .xls
 * files and suspicious archives (POI's zip-bomb guard) are refused with a clear message.
 */
final class XlsxTableReader {

    private XlsxTableReader() {
    }

    static RawTable read(byte[] content, int maxRows) {
        if (FileMagic.valueOf(content) == FileMagic.OLE2) {
            throw new UploadRejected("The workbook is password-protected or in the old .xls format. Remove the "
                    + "password and save it as .xlsx, then upload again.");
        }
        try (OPCPackage pkg = OPCPackage.open(new ByteArrayInputStream(content))) {
            XSSFReader reader = new XSSFReader(pkg);
            XSSFReader.SheetIterator sheets = (XSSFReader.SheetIterator) reader.getSheetsData();
            List<String> names = new ArrayList<>();
            byte[] first = null;
            while (sheets.hasNext()) {
                try (InputStream in = sheets.next()) {
                    if (first == null) {
                        first = in.readAllBytes();
                    }
                }
                names.add(sheets.getSheetName());
            }
            if (names.isEmpty()) {
                throw new UploadRejected("The workbook has no sheet.");
            }
            if (names.size() > 1) {
                throw new UploadRejected("The workbook has " + names.size() + " sheets (" + String.join(", ", names)
                        + "). Put the figures on one sheet and remove the others, so nothing is left out by mistake.");
            }
            ReadOnlySharedStringsTable strings = new ReadOnlySharedStringsTable(pkg);
            StylesTable styles = reader.getStylesTable();
            SheetHandler handler = new SheetHandler(strings, styles, maxRows);
            XMLReader xml = SAXHelper.newXMLReader();
            xml.setContentHandler(handler);
            xml.parse(new InputSource(new ByteArrayInputStream(first)));
            return handler.table();
        } catch (UploadRejected e) {
            throw e;
        } catch (OLE2NotOfficeXmlFileException | EncryptedDocumentException e) {
            throw new UploadRejected("The workbook is password-protected or not an .xlsx file.");
        } catch (NotOfficeXmlFileException | InvalidFormatException e) {
            throw new UploadRejected("The file is not an .xlsx workbook.");
        } catch (IOException | OpenXML4JException | SAXException | RuntimeException e) {
            String m = String.valueOf(e.getMessage());
            if (m.toLowerCase(Locale.ROOT).contains("zip bomb")) {
                throw new UploadRejected("The workbook expands to far more data than its size suggests and was "
                        + "refused for safety. Save it again from your spreadsheet program.");
            }
            throw new UploadRejected("The workbook could not be read: " + firstLine(m));
        } catch (javax.xml.parsers.ParserConfigurationException e) {
            throw new IllegalStateException(e);
        }
    }

    private static String firstLine(String m) {
        int nl = m.indexOf('\n');
        return nl > 0 ? m.substring(0, nl) : m;
    }

    /** Collects the cells of the sheet XML. */
    private static final class SheetHandler extends DefaultHandler {
        private final ReadOnlySharedStringsTable strings;
        private final StylesTable styles;
        private final int maxRows;
        private final TreeMap<Integer, Map<Integer, RawValue>> rows = new TreeMap<>();
        private final StringBuilder text = new StringBuilder();
        private final StringBuilder formula = new StringBuilder();
        private int rowNumber;
        private int column;
        private String type;
        private int style;
        private boolean inValue;
        private boolean inFormula;
        private boolean inInline;

        SheetHandler(ReadOnlySharedStringsTable strings, StylesTable styles, int maxRows) {
            this.strings = strings;
            this.styles = styles;
            this.maxRows = maxRows;
        }

        @Override
        public void startElement(String uri, String localName, String qName, Attributes atts) {
            switch (localName) {
                case "row" -> {
                    String r = atts.getValue("r");
                    rowNumber = r == null ? rowNumber + 1 : Integer.parseInt(r);
                    if (rows.size() > maxRows) {
                        throw new UploadRejected("The sheet has more than " + maxRows + " data rows; split it into "
                                + "smaller files (for example one per month).");
                    }
                }
                case "c" -> {
                    String ref = atts.getValue("r");
                    column = ref == null ? column + 1 : columnIndex(ref);
                    type = atts.getValue("t");
                    String s = atts.getValue("s");
                    style = s == null ? -1 : Integer.parseInt(s);
                    text.setLength(0);
                    formula.setLength(0);
                }
                case "v" -> inValue = true;
                case "f" -> inFormula = true;
                case "t" -> inInline = "inlineStr".equals(type);
                default -> {
                }
            }
        }

        @Override
        public void characters(char[] ch, int start, int length) {
            if (inValue || inInline) {
                text.append(ch, start, length);
            } else if (inFormula) {
                formula.append(ch, start, length);
            }
        }

        @Override
        public void endElement(String uri, String localName, String qName) {
            switch (localName) {
                case "v" -> inValue = false;
                case "f" -> inFormula = false;
                case "t" -> inInline = false;
                case "c" -> {
                    RawValue v = value();
                    if (v != null) {
                        rows.computeIfAbsent(rowNumber, k -> new HashMap<>()).put(column, v);
                    }
                }
                default -> {
                }
            }
        }

        private RawValue value() {
            if (!formula.isEmpty()) {
                return new RawValue.Formula("=" + formula);
            }
            String raw = text.toString();
            if (type == null || type.equals("n")) {
                if (raw.isEmpty()) {
                    return null;
                }
                double d = Double.parseDouble(raw);
                if (style >= 0 && isDateStyle(style)) {
                    return new RawValue.Date(DateUtil.getLocalDateTime(d).toLocalDate());
                }
                return new RawValue.Number(d);
            }
            return switch (type) {
                case "s" -> new RawValue.Text(strings.getItemAt(Integer.parseInt(raw)).getString());
                case "inlineStr", "str" -> new RawValue.Text(raw);
                case "b" -> new RawValue.Other("a true/false value");
                case "e" -> new RawValue.Other("an error value (" + raw + ")");
                case "d" -> new RawValue.Text(raw);
                default -> new RawValue.Other("a cell of type " + type);
            };
        }

        private boolean isDateStyle(int index) {
            XSSFCellStyle s = styles.getStyleAt(index);
            return s != null && DateUtil.isADateFormat(s.getDataFormat(), s.getDataFormatString());
        }

        RawTable table() {
            List<String> header = null;
            Map<Integer, String> headerByColumn = new HashMap<>();
            List<RawTable.Row> out = new ArrayList<>();
            for (Map.Entry<Integer, Map<Integer, RawValue>> e : rows.entrySet()) {
                if (header == null) {
                    header = new ArrayList<>();
                    for (Map.Entry<Integer, RawValue> c : new TreeMap<>(e.getValue()).entrySet()) {
                        String name = c.getValue() instanceof RawValue.Text t ? t.value().trim().toLowerCase(Locale.ROOT)
                                : "#column" + c.getKey();
                        header.add(name);
                        headerByColumn.put(c.getKey(), name);
                    }
                    continue;
                }
                Map<String, RawValue> cells = new LinkedHashMap<>();
                for (Map.Entry<Integer, RawValue> c : e.getValue().entrySet()) {
                    String name = headerByColumn.getOrDefault(c.getKey(), "#extra");
                    cells.put(name, c.getValue());
                }
                out.add(new RawTable.Row(e.getKey(), cells));
            }
            if (header == null) {
                throw new UploadRejected("The sheet is empty.");
            }
            if (out.size() > maxRows) {
                throw new UploadRejected("The sheet has more than " + maxRows + " data rows; split it into smaller "
                        + "files (for example one per month).");
            }
            return new RawTable(header, out);
        }

        private static int columnIndex(String ref) {
            int col = 0;
            for (int i = 0; i < ref.length() && Character.isLetter(ref.charAt(i)); i++) {
                col = col * 26 + (Character.toUpperCase(ref.charAt(i)) - 'A' + 1);
            }
            return col;
        }
    }
}
