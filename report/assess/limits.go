package assess

import (
	"github.com/sparkmargin/sparkmargin/inventory"
	"github.com/sparkmargin/sparkmargin/model"
)

// LimitsFromSite returns base with the limits the Site sheet overrides. The
// inventory reader validated the items against the limit table's Site items
// (inventory.LimitItems, generated from model.LimitTable; a value that cannot
// be used rejected its row and is not in site.Limits), so this only applies
// them through the same table (model.SetLimitItem), in sheet order.
func LimitsFromSite(site inventory.Site, base model.Limits) model.Limits {
	lim := base
	for _, sl := range site.Limits {
		model.SetLimitItem(&lim, sl.Name, sl.Value)
	}
	return lim
}
