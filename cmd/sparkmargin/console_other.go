//go:build !windows

package main

import "os"

// nativeASCII is false: macOS and Linux terminals, pipes and files take UTF-8.
func nativeASCII(*os.File) bool { return false }
