package photo

// progressive reports whether a JPEG's frame is progressive (an SOF2 or
// later progressive start-of-frame marker before the first scan).
func progressive(data []byte) bool {
	i := 2
	for i+4 <= len(data) {
		if data[i] != 0xFF {
			return false
		}
		m := data[i+1]
		switch {
		case m == 0xFF: // fill byte
			i++
			continue
		case m == 0xC2 || m == 0xC6 || m == 0xCA || m == 0xCE:
			return true
		case m == 0xC0 || m == 0xC1 || m == 0xDA:
			return false
		}
		i += 2 + int(data[i+2])<<8 + int(data[i+3])
	}
	return false
}
