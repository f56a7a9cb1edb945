// Command sparkmargin screens static-electricity ignition hazards from a line-survey workbook.
package main

import "os"

func main() { os.Exit(run(os.Args[1:], os.Stdout, os.Stderr)) }
