package main

// Blank imports keep the chosen dependencies in go.mod while the packages that
// use them are being written. Remove once every one is imported for real.
import (
	_ "gonum.org/v1/gonum/floats/scalar"
	_ "gonum.org/v1/gonum/integrate/quad"
	_ "gonum.org/v1/gonum/stat/distuv"
	_ "gonum.org/v1/gonum/unit/constant"
)
