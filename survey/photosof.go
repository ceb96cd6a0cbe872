package survey

// PhotoIndex answers which photos belong to a CML or a component, by one
// rule for every output.
type PhotoIndex struct {
	byCML       map[*CML][]*Photo
	byComponent map[*Component][]*Photo
}

// IndexPhotos applies the rule once for the whole survey: a CML's photos are
// those its row names, in the order written, then those placed on it by GPS
// position, in name order; a component's own photos are those placed on its
// area by position. Placements name asset, component and CML, so equal CML
// ids in different components never share photos.
func IndexPhotos(s *Survey) *PhotoIndex {
	ix := &PhotoIndex{byCML: map[*CML][]*Photo{}, byComponent: map[*Component][]*Photo{}}
	byName := make(map[string]*Photo, len(s.Photos))
	for _, ph := range s.Photos {
		byName[ph.Name] = ph
	}
	type where struct{ asset, component, cml string }
	cmls := map[where]*CML{}
	comps := map[where]*Component{}
	for _, a := range s.Assets {
		for _, c := range a.Components {
			comps[where{a.Name, c.Name, ""}] = c
			for _, m := range c.CMLs {
				cmls[where{a.Name, c.Name, m.ID}] = m
				for _, ref := range m.PhotoRefs {
					if ph := byName[ref]; ph != nil {
						ix.byCML[m] = append(ix.byCML[m], ph)
					}
				}
			}
		}
	}
	for _, ph := range s.Photos {
		pl := ph.Placement
		switch pl.Basis {
		case PlacedNearestCML:
			if m := cmls[where{pl.Asset, pl.Component, pl.CML}]; m != nil {
				ix.byCML[m] = append(ix.byCML[m], ph)
			}
		case PlacedComponent:
			if c := comps[where{pl.Asset, pl.Component, ""}]; c != nil {
				ix.byComponent[c] = append(ix.byComponent[c], ph)
			}
		}
	}
	return ix
}

// OfCML lists the photos of a CML.
func (ix *PhotoIndex) OfCML(m *CML) []*Photo { return ix.byCML[m] }

// OfComponent lists the photos placed on a component's area but on none of its CMLs.
func (ix *PhotoIndex) OfComponent(c *Component) []*Photo { return ix.byComponent[c] }
