module pare

go 1.26.8

require (
	github.com/BurntSushi/toml v1.6.0
	gonum.org/v1/gonum v0.17.0
)

require github.com/ajstarks/svgo v0.0.0-20211024235047-1546f124cd8b
