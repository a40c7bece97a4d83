// Package spec owns the recipe model and its loader: a recipe file is
// decoded with positions (spec/yamldoc), validated against
// schemas/recipe.schema.json, and converted into a Recipe in which every
// value carries its line and column and every amount is parsed once into
// canonical units (spec/units). Sub-packages hold the catalog, formulas,
// units, positioned problems, evaluation against the solver and project
// discovery.
package spec
