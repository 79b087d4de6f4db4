// Command wedgebound computes certified enclosures of extreme spectral values
// of phase-space operators and writes them as JSON certificates.
//
// Usage: wedgebound <subcommand> [flags]. Run "wedgebound help" for the list.
package main

import (
	"fmt"
	"io"
	"os"
	"sort"
	"strings"

	"wedgebound/certificates"
)

// command is one subcommand: run parses its own flags from args and returns
// the process exit code (0 success, 1 a claim or computation failed, 2 bad
// input or usage).
type command struct {
	summary string
	run     func(args []string, stdout, stderr io.Writer) int
}

// commands is filled by the init functions of the subcommand files.
var commands = map[string]command{}

func register(name, summary string, run func(args []string, stdout, stderr io.Writer) int) {
	commands[name] = command{summary: summary, run: run}
}

func usage(w io.Writer) {
	fmt.Fprintln(w, "usage: wedgebound <subcommand> [flags]")
	fmt.Fprintln(w, "subcommands:")
	names := make([]string, 0, len(commands))
	for n := range commands {
		names = append(names, n)
	}
	sort.Strings(names)
	for _, n := range names {
		fmt.Fprintf(w, "  %-10s %s\n", n, commands[n].summary)
	}
	fmt.Fprintln(w, "  version    print the version and the certificate schema and kinds it writes")
	fmt.Fprintln(w, "run \"wedgebound <subcommand> --help\" for its flags; \"wedgebound --version\" for the version")
}

func main() {
	os.Exit(dispatch(os.Args[1:], os.Stdout, os.Stderr))
}

func dispatch(args []string, stdout, stderr io.Writer) int {
	if len(args) == 0 || args[0] == "help" || args[0] == "-h" || args[0] == "--help" {
		usage(stdout)
		if len(args) == 0 {
			return 2
		}
		return 0
	}
	if args[0] == "--version" || args[0] == "version" {
		printVersion(stdout)
		return 0
	}
	c, ok := commands[args[0]]
	if !ok {
		fmt.Fprintf(stderr, "wedgebound: unknown subcommand %q (run \"wedgebound help\")\n", args[0])
		return 2
	}
	return c.run(args[1:], stdout, stderr)
}

// printVersion prints the program version and the schema it writes.
func printVersion(w io.Writer) {
	fmt.Fprintf(w, "wedgebound %s\n", certificates.Version)
	fmt.Fprintf(w, "writes and reads schema %s, kinds %s\n", certificates.Schema, strings.Join([]string{certificates.KindRelaxation, certificates.KindStrip, certificates.KindFlight, certificates.KindPrecession, certificates.KindMatched}, ", "))
}
