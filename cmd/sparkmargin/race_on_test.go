//go:build race

package main

// raceEnabled is true under go test -race: the corpus tests then run a
// sample of the corpus (the full corpus runs in the plain go test).
const raceEnabled = true
