//go:build windows

package main

import (
	"os"
	"syscall"
)

// cpUTF8 is the code page number of UTF-8 (Microsoft, "Code Page
// Identifiers": 65001).
const cpUTF8 = 65001

var procGetConsoleOutputCP = syscall.NewLazyDLL("kernel32.dll").NewProc("GetConsoleOutputCP")

// nativeASCII: a console is written in Unicode (Go's os.File writes a
// console handle with WriteConsoleW), so it shows µ and Ω whatever its code
// page; output redirected to a pipe or file is read by a program that
// decodes it with the console's output code page, so it gets ASCII when
// that code page is not UTF-8 (no console at all: UTF-8).
func nativeASCII(f *os.File) bool {
	var mode uint32
	if syscall.GetConsoleMode(syscall.Handle(f.Fd()), &mode) == nil {
		return false // a console
	}
	if procGetConsoleOutputCP.Find() != nil {
		return false
	}
	cp, _, _ := procGetConsoleOutputCP.Call()
	return cp != 0 && cp != cpUTF8
}
