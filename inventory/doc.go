// Package inventory reads and validates a line-survey workbook (.xlsx) into a
// Survey: the site, its flammable atmospheres, its stations, the charged
// objects on them and the site's materials, every quantity in SI units, every
// problem located by sheet, row, column and field.
//
//	s, err := inventory.ReadFile("survey.xlsx", inventory.ReadOptions{})
//	// err wraps ErrUnreadable: not a workbook at all (exit 2).
//	// s.Problems: every located problem, errors and warnings, in sheet/row/column order.
//	// s.Counts: per sheet, Read == Accepted + Rejected.
//
// # Reading
//
// The file is stat-ed and refused above ReadOptions.MaxFileSize before it is
// opened; its bytes are hashed (Survey.SHA256) and sniffed, so an empty file,
// a CSV or text file, an encrypted (password-protected) workbook or old .xls,
// a truncated zip and random bytes each get one sentence. The workbook is
// read by the package's own reader (pkg.go, xmltok.go, sheetscan.go), not by
// a spreadsheet library: the zip's directory is indexed (two entries of one
// name, or parts declaring more than the unzip limit in total, refuse the
// file); the workbook part is found through the package relationships, its
// sheets, date system and relationships read, and each sheet's part is the
// one its relationship points to, wherever it is stored (a relationship that
// points outside the package is refused and never followed). Every part the
// reader needs is unpacked once, as a stream, and read once by xmlTok, a
// tokenizer that is also the part's check: XML that is malformed or cut
// short, a DOCTYPE (entities are never declared or expanded), a text
// encoding other than UTF-8 (a UTF-16 part is named as such), a tag over
// 1 MiB, a text run over 4 MiB, nesting over 256 deep, a part that unpacks
// to another size than its zip header states, or a compression method the
// zip reader does not know each refuse the file with one sentence naming the
// part (and, for a sheet, the last row read). Parts the reader does not need
// (media, themes) are never unpacked. The style table is read for which cell
// formats show dates; the shared strings are kept as one block of text, at
// most 1,048,576 of them or one per byte of the file, whichever is more.
// No temporary file is made.
//
// A sheet is scanned row by row: every cell is placed by its reference (in
// any order); a row out of order or repeated, with a bad row number, a cell
// reference that is no cell (A0, ZZZZZ5, a row past 1,048,576), a cell outside
// its row or two cells at one place is an error at that row and the row is
// rejected, never merged into another; a cell whose shared-string index or
// style is not in the workbook, or whose type is unknown, is an error at the
// cell. Rows are kept up to their last non-blank cell and at most to column
// AMJ (1024): values beyond get one warning per sheet, and a sheet part with
// more than 200 of them is refused. What is kept of rows that are not
// streamed is bounded by the file's size (cells and text), and a cell holds
// at most 32,767 characters. Raw cell values are read (numbers unformatted;
// a formula gives its cached value; formulas are never calculated), and on
// every row of every sheet, whatever its size: a TRUE/FALSE cell in a
// numeric column is an error rather than 1 or 0; a number in a numeric
// column whose format shows a date is an error (its serial, e.g. 46025,
// would pass for a value); a cell of a known column holding a formula
// without a stored result is an error (not "not measured").
// Hidden rows and sheets are read like any other, with a warning.
//
// Sheet names match case-insensitively. Two sheets whose names differ only
// in case or spaces ("Objects", "OBJECTS", "Obj ects") and match one survey
// sheet are an error on that sheet, and neither is read. Sheets outside the
// contract get a warning, except helper sheets (Lists, Help, Read me, Instructions, About).
// Missing Site, Stations or Objects sheets are errors; Atmospheres, Materials
// and Changes are optional.
//
// The header of a table sheet is the first row, within the first 10, in which
// at least two cells match columns of the sheet (a title row above it is
// allowed and noted as a warning). Headers match case-insensitively, with
// surrounding and repeated spaces, '-' and '_' ignored, the unit in brackets,
// parentheses, after a space, or absent; a unit written in the header replaces
// the column's default and must have its dimension (else an error, and every
// row with a value in that column is rejected). Unknown columns are warnings;
// a duplicate column is an error (the first is read); a missing required
// column (ID, Station, Kind on Objects; ID, Kind on Atmospheres; ID on
// Stations; Name on Materials; Change, Value on Changes) rejects every row of
// the sheet. A value in a column with no header at all gets a warning. Blank
// rows are skipped and not counted.
//
// The Site sheet is Item | Value in columns A and B, with or without the
// header row; other columns (the template's cautions in D) are not read.
// Items match like headers ("Relative humidity [%]", "relative humidity").
// Survey date is an ISO date (2026-03-14, optionally with a time) or a
// spreadsheet date serial (1900 or 1904 system, as the workbook says); other
// forms (14/03/2026) are refused as ambiguous. Other items are the site's
// limit overrides (LimitItems: "Shock energy [mJ] | 400"; a generated view of
// model's limit table, the value read with the cell grammar below) and uncertainty
// overrides (UncertaintyItems: "Uncertainty field [%] | 15"), validated here
// into Site.Limits and Site.Uncertainties: a value that cannot be used
// rejects its row (check reports it, assess lists it as rejected); an item
// that names nothing known is a warning and is ignored.
//
// # Cells
//
// ParseQuantity reads a numeric cell: SI prefixes p n µ/u m c k M G T on the
// units of each dimension, a per-cell unit that wins over the header's and
// must have the same dimension, decimal comma only as the only comma, ±
// relative uncertainty, "n/a", "na", "-", "?", "none" as not measured with a
// warning, blank as not measured (never zero), NaN and Inf refused. "mΩ" is
// milliohm and gets a note, since megaohm is written M.
//
// # Validation and rejection
//
// A row with an error is rejected with its reasons (Survey.Rejected); a row
// with only warnings is accepted. Rejection cascades along references so that
// nothing is assessed against a wrong context: an object whose station is
// rejected, a station whose atmosphere is rejected, an object whose material
// row is rejected, are themselves rejected ("station ST-2 was rejected
// (Stations!3)"). A station that names no atmosphere is accepted as having
// none. Duplicate IDs (case-insensitive) reject the second row, naming the
// first. References that differ from an ID only in letter case are accepted
// with a warning and stored as the ID. A station or site RH below 1 % gets a
// warning (a cell formatted as a percentage stores 45 % as 0.45).
//
// Per-kind requirements are listed by KindRequirements. Plausibility limits
// that flag likely unit slips with a suggested reading are the Max* constants;
// a surface potential on a thin layer (< 10 mm) with an earthed backing is not
// flagged, since such layers hold high charge densities (the propagating-brush
// case).
//
// Atmospheres: a Substance from the built-in list fills a blank MIE and Group
// (recorded in MIEFromSubstance, GroupFromSubstance); an unknown substance is
// an error only when the MIE is blank. Gas groups and zones with dust kinds,
// and the reverse, are errors; hybrid takes either. Blank Group or Zone is a
// warning.
//
// Materials: a Materials row with the name of a built-in overrides it (blank
// cells keep the built-in values; the override is a warning and is recorded in
// Material.Source); other rows add materials. Survey.Materials holds the
// built-ins (overridden where the survey says) then the survey's own.
package inventory
