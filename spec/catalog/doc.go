// Package catalog owns phgate's ingredient catalog: the embedded default
// catalog (data/*.yaml), the loader for users' project catalog files and
// catalogs declared inline in a recipe, and the checks that keep every
// entry traceable (each number names a source) and consistent (species
// charges, non-decreasing pKa, electrically neutral ingredients).
//
// The file format is YAML with kebab-case keys, described by
// schemas/catalog.schema.json. Molar masses are computed from formulas
// with spec/formula. Problems carry 1-based line and column, columns
// counted in runes.
package catalog
