package main

import (
	"fmt"
	"io"
	"math"
	"text/tabwriter"

	"github.com/spf13/cobra"

	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/model"
)

func newLibraryCmd() *cobra.Command {
	return &cobra.Command{
		Use:   "library",
		Short: "List the built-in materials, substances and limits with their sources",
		Args:  cobra.NoArgs,
		RunE: func(c *cobra.Command, args []string) error {
			writeLibrary(c.OutOrStdout())
			return nil
		},
	}
}

func num(v float64, format string) string {
	if math.IsNaN(v) {
		return "-"
	}
	return fmt.Sprintf(format, v)
}

func writeLibrary(out io.Writer) {
	fmt.Fprintln(out, "Materials (surface resistivity at 50 % RH; a survey's Materials sheet overrides a built-in of the same name)")
	tw := tabwriter.NewWriter(out, 0, 0, 2, ' ', 0)
	fmt.Fprintln(tw, "Name\tClass\tepsr\tSurface [Ω]\tSlope [dec/10 %RH]\tVolume [Ω·m]\tBreakdown [kV/mm]\tSource")
	for _, m := range inventory.BuiltinMaterials() {
		fmt.Fprintf(tw, "%s\t%s\t%s\t%s\t%s\t%s\t%s\t%s\n", m.Name, m.Class, num(m.Permittivity, "%.3g"),
			num(m.SurfaceResistivity, "%.0e"), num(m.HumiditySlope, "%.2g"), num(m.VolumeResistivity, "%.0e"),
			num(m.BreakdownStrength/1e6, "%.3g"), m.Source)
	}
	tw.Flush()
	fmt.Fprintln(out, "\nSubstances (MIE and group; conductivity and permittivity of the liquid)")
	tw = tabwriter.NewWriter(out, 0, 0, 2, ' ', 0)
	fmt.Fprintln(tw, "Name\tKind\tMIE [mJ]\tGroup\tConductivity [pS/m]\tepsr\tSource")
	for _, s := range inventory.BuiltinSubstances() {
		fmt.Fprintf(tw, "%s\t%s\t%s\t%s\t%s\t%s\t%s\n", s.Name, s.Kind, num(s.MIE*1e3, "%.3g"), s.Group,
			num(s.Conductivity*1e12, "%.3g"), num(s.Permittivity, "%.3g"), s.Source)
	}
	tw.Flush()
	fmt.Fprintln(out, "\nLimits applied by default (SI units; [M] recalled, not confirmed against the standard's text here)")
	tw = tabwriter.NewWriter(out, 0, 0, 2, ' ', 0)
	fmt.Fprintln(tw, "Limit\tValue\tUnit\tSource")
	for _, c := range model.LimitSources() {
		src := c.Source
		if c.FromMemory {
			src = "[M] " + src
		}
		fmt.Fprintf(tw, "%s\t%s\t%s\t%s\n", c.Limit, num(c.Value, "%.4g"), c.Unit, src)
	}
	tw.Flush()
	fmt.Fprintln(out, "\nSite sheet items that override a limit (Item | Value; the unit may be given in the item or the value)")
	tw = tabwriter.NewWriter(out, 0, 0, 2, ' ', 0)
	fmt.Fprintln(tw, "Item\tDefault unit\tSets")
	for _, k := range inventory.LimitItems() {
		fmt.Fprintf(tw, "%s\t%s\t%s\n", k.Name, k.Unit, k.Note)
	}
	tw.Flush()
}
