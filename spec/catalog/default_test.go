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
