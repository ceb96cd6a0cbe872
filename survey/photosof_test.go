package survey

import "testing"

// Photos follow asset, component and CML together: two components that both
// have a CML "S-01" never share a photo placed on one of them.
func TestPhotoIndexKeepsEqualIDsApart(t *testing.T) {
	m1, m2 := &CML{ID: "S-01", PhotoRefs: []string{"named.jpg"}}, &CML{ID: "S-01"}
	c1, c2 := &Component{Name: "Course 1", CMLs: []*CML{m1}}, &Component{Name: "Course 2", CMLs: []*CML{m2}}
	named := &Photo{Name: "named.jpg", Placement: Placement{Asset: "T-1", Component: "Course 1", CML: "S-01", Basis: PlacedNamed}}
	near := &Photo{Name: "near.jpg", Placement: Placement{Asset: "T-1", Component: "Course 2", CML: "S-01", Basis: PlacedNearestCML}}
	area := &Photo{Name: "area.jpg", Placement: Placement{Asset: "T-1", Component: "Course 1", Basis: PlacedComponent}}
	s := &Survey{Assets: []*Asset{{Name: "T-1", Components: []*Component{c1, c2}}}, Photos: []*Photo{area, named, near}}
	ix := IndexPhotos(s)
	if got := ix.OfCML(m1); len(got) != 1 || got[0] != named {
		t.Errorf("course 1 S-01: %v, want named.jpg only", got)
	}
	if got := ix.OfCML(m2); len(got) != 1 || got[0] != near {
		t.Errorf("course 2 S-01: %v, want near.jpg only", got)
	}
	if got := ix.OfComponent(c1); len(got) != 1 || got[0] != area {
		t.Errorf("course 1 area: %v, want area.jpg", got)
	}
	if got := ix.OfComponent(c2); len(got) != 0 {
		t.Errorf("course 2 area: %v, want none", got)
	}
}
