// Package htmlreport writes phgate's self-contained HTML report: for each
// recipe the computed results, ingredients, acid–base systems, findings,
// the four charts and the caution, in one file with inline CSS and inline
// SVG. The file has no scripts and fetches nothing; it reads on a phone,
// prints one recipe per page, and is well-formed XML so tools (and our
// tests) can parse it with encoding/xml.
package htmlreport
