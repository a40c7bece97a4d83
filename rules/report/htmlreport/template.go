package htmlreport

import (
	_ "embed"
	"html/template"
)

//go:embed page.gohtml
var pageSource string

// pageTemplate is the whole document. Void elements are closed ("<meta
// … />") so the output stays well-formed XML.
var pageTemplate = template.Must(template.New("page").Parse(pageSource))
