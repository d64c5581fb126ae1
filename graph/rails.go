package graph

import "sort"

// IsRail reports whether a net of this role is a rail: a supply, bias or
// heater net, at AC ground for the signal but never chassis.
func (r Role) IsRail() bool { return r == Supply || r == Bias || r == Heater }

// retireRail records a rail net that a join is about to delete, so that
// the terminals that returned to it keep its name, voltage and label
// (Circuit.Rails, Pin.Rail). It returns the name the moved pins take, or ""
// when gone is not a rail.
func (c *Circuit) retireRail(gone *Net) string {
	if gone == nil || !gone.Role.IsRail() {
		return ""
	}
	i := sort.Search(len(c.Rails), func(i int) bool { return c.Rails[i].Name >= gone.Name })
	if i < len(c.Rails) && c.Rails[i].Name == gone.Name {
		return gone.Name
	}
	n := *gone
	c.Rails = append(c.Rails, nil)
	copy(c.Rails[i+1:], c.Rails[i:])
	c.Rails[i] = &n
	return gone.Name
}

// ReturnOf is the net a terminal returns to for the drawing: the rail it
// sat on before a reduction joined that rail away (from Circuit.Rails),
// else the net it is on now. Nil for a terminal on no known net.
func (c *Circuit) ReturnOf(pin Pin) *Net {
	if pin.Rail != "" {
		for _, n := range c.Rails {
			if n.Name == pin.Rail {
				return n
			}
		}
		if n := c.Net(pin.Rail); n != nil {
			return n
		}
	}
	return c.Net(pin.Net)
}
