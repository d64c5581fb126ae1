package stages

import (
	"testing"

	"pare/internal/testmain"
)

// TestMain runs the tests under the command's collector setting
// (internal/testmain).
func TestMain(m *testing.M) { testmain.Main(m) }
