package photo

import (
	"path/filepath"
	"strings"
)

// NotPhoto says why a file is not taken as a photo, judged by its name, or ""
// when it may be one.
func NotPhoto(name string) string {
	base := filepath.Base(name)
	ext := strings.ToLower(filepath.Ext(name))
	switch {
	case strings.HasPrefix(base, "._") || base == ".DS_Store" || base == "Thumbs.db" || base == "desktop.ini":
		return "system file"
	case ext == ".jpg" || ext == ".jpeg" || ext == ".jpe":
		return ""
	case ext == ".heic" || ext == ".heif":
		return "HEIC photo: export it as JPEG"
	case ext == ".png" || ext == ".gif" || ext == ".tif" || ext == ".tiff" || ext == ".webp" || ext == ".bmp" || ext == ".dng":
		return "not a JPEG (" + strings.TrimPrefix(ext, ".") + ")"
	case ext == ".mp4" || ext == ".mov" || ext == ".avi" || ext == ".m4v" || ext == ".3gp":
		return "video"
	}
	return "not a JPEG"
}
