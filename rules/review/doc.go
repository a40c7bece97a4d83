// Package review compares two evaluated versions of a set of recipes: the
// old side and the new side of a change. It pairs recipes by id (so moves
// and renames pair up), says for every pair how the computed chemistry
// moved (pH, buffer capacity, ionic strength, q.s. amounts, dominant
// species, ingredient amounts, findings) and why (the recipe was edited,
// a stock recipe, a catalog entry or phgate.yaml changed), applies the
// review gates, and writes the comparison as text, JSON or markdown.
//
// It does not know where the sides come from: folders on disk or trees
// materialised from git revisions by package gitrev look the same here.
package review
