// Command sheaf checks, evaluates and exports structural calculation sheets.
//
// Run `sheaf --help` for the commands. Results must be checked by a qualified
// engineer; limits, factors and load combinations come from the local code.
package main

import "os"

func main() {
	os.Exit(Main(os.Args[1:], os.Stdin, os.Stdout, os.Stderr))
}
