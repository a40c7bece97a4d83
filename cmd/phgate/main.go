// Command phgate computes the acid–base equilibrium of aqueous product
// recipes kept as YAML files, checks them against formulation rules, and
// shows how results move between revisions.
package main

import "os"

func main() {
	os.Exit(New(os.Stdin, os.Stdout, os.Stderr).Run(os.Args[1:]))
}
