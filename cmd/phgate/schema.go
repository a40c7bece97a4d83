package main

import (
	"sort"
	"strings"

	"github.com/phgate/phgate/schemas"
)

func (a *App) schema(args []string) int {
	fs := a.flags("schema", "recipe|catalog|config")
	names, err := parse(fs, args)
	if err != nil {
		if isHelp(err) {
			return ExitOK
		}
		return ExitProblem
	}
	known := map[string]string{"recipe": "recipe.schema.json", "catalog": "catalog.schema.json", "config": "config.schema.json"}
	if len(names) != 1 || known[names[0]] == "" {
		kinds := make([]string, 0, len(known))
		for k := range known {
			kinds = append(kinds, k)
		}
		sort.Strings(kinds)
		return a.fail("schema takes one of: %s", strings.Join(kinds, ", "))
	}
	b, err := schemas.FS.ReadFile(known[names[0]])
	if err != nil {
		return a.fail("%v", err)
	}
	_, err = a.Stdout.Write(b)
	if err != nil {
		return a.fail("%v", err)
	}
	return ExitOK
}
