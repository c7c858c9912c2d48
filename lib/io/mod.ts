/**
 * Reading spectrometer exports: delimited text of many layouts and JCAMP-DX.
 *
 * @module
 */
export * from "./input_error.ts";
export * from "./decode_text.ts";
export * from "./header_units.ts";
export * from "./read_table.ts";
export * from "./spectra_from_table.ts";
export * from "./read_spectra.ts";
export * from "./read_jcamp.ts";
export * from "./read_file.ts";
export * from "./parse_sheet.ts";
export * from "./spectrum_columns.ts";
export * from "./write_jcamp.ts";
export * from "./write_spectrum_csv.ts";
