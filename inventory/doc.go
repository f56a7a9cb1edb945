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
// opened with excelize's unzip limits and a private temporary folder that is
// removed afterwards; a panic inside the reader becomes an UnreadableError.
// Before excelize reads them, the worksheet and shared-strings parts are
// streamed once through a check (partscan.go): parts declaring more than the
// unzip limit in total, a part that unpacks to more than its zip header says,
// a run of over 4 MiB without markup (a bomb of zeros under the limit, which
// excelize's XML decoder would hold in memory whole), or XML that is
// malformed or cut short (excelize's row iterator stops silently at a syntax
// error, so rows would be lost unseen) make the file unreadable. Entities are
// never resolved. Parts over 64 MiB are checked for their closing tag and text
// runs only, not token by token. A zip without a workbook part says what it
// is (OpenDocument, .docx, .pptx). Rows are kept up to their last non-blank
// cell and at most to column AMJ (1024): values beyond get one warning per
// sheet, and a sheet part with more than 200 cells beyond AMJ is refused
// (excelize would make each such row a slice of up to 16384 cells).
// Rows are streamed with raw cell values (numbers unformatted; a formula gives
// its cached value; formulas are never calculated). After streaming, on
// sheets of up to 5000 rows, a cell reading 0 or 1 in a numeric column is
// asked for its type, so a TRUE/FALSE cell is an error rather than 1 or 0; a
// number in a numeric column whose format shows a date is an error (its
// serial, e.g. 46025, would pass for a value); a blank cell of a known column
// holding a formula without a stored result is an error (not "not measured").
// Hidden rows and sheets are read like any other, with a warning.
//
// Sheet names match case-insensitively. Sheets outside the contract get a
// warning, except helper sheets (Lists, Help, Read me, Instructions, About).
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
// limit overrides (LimitItems: "Shock energy [mJ] | 400") and uncertainty
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
