// Package schemas embeds phgate's JSON Schemas (draft 2020-12) so that
// loaders validate user files against exactly the documents published in
// this folder.
package schemas

import "embed"

// FS holds every *.json schema in this folder, e.g. "catalog.schema.json".
//
//go:embed *.json
var FS embed.FS
