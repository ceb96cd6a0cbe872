module github.com/lossline/lossline

go 1.26.8

require (
	github.com/yuin/goldmark v1.8.7
	github.com/yuin/goldmark-meta v1.1.0
)

require (
	github.com/kr/pretty v0.3.1 // indirect
	github.com/rwcarlsen/goexif v0.0.0-20190401172101-9e8deecbddbd // indirect
	golang.org/x/image v0.48.0 // indirect
	gopkg.in/check.v1 v1.0.0-20190902080502-41f04d3bba15 // indirect
	gopkg.in/yaml.v2 v2.3.0 // indirect
)
