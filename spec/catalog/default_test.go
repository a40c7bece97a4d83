package catalog

import "testing"

func TestDefaultParsesCleanly(t *testing.T) {
	c, probs := loadEmbedded()
	for _, p := range probs {
		t.Error(p)
	}
	if len(c.Ingredients) < 80 {
		t.Errorf("built-in catalog has %d ingredients, want at least 80", len(c.Ingredients))
	}
	if Default() == nil {
		t.Fatal("Default() returned nil")
	}
}

// TestDefaultHasNoInventedNumbers keeps made-up demo data out of the
// built-in catalog: every source there is checked, from memory or derived.
func TestDefaultHasNoInventedNumbers(t *testing.T) {
	for id, s := range Default().Sources {
		if s.Status != StatusChecked && s.Status != StatusFromMemory && s.Status != StatusDerived {
			t.Errorf("source %s has status %q", id, s.Status)
		}
	}
}
