// Package gitrev reads old versions of a repository's files straight from
// git objects, without touching the working tree, the index or any ref.
//
// Every revision a user types is checked twice: first by its shape (it
// may not start with "-", which git would read as an option, nor hold
// control characters), then by git itself with
// `git rev-parse --verify --end-of-options REV^{commit}`. Only the full
// commit hash that check prints is passed to later commands, and those
// are read-only plumbing (`ls-tree`, `cat-file --batch`), run without a
// shell with a fixed argument order. Files are written only inside a
// folder the caller creates with os.MkdirTemp.
package gitrev
