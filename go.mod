module github.com/sheaf-calc/sheaf

go 1.26.8

require (
	github.com/BurntSushi/toml v1.2.1 // indirect
	github.com/expr-lang/expr v1.17.8 // indirect
	github.com/inconshreveable/mousetrap v1.1.0 // indirect
	github.com/spf13/cobra v1.10.2 // indirect
	github.com/spf13/pflag v1.0.9 // indirect
	github.com/yuin/goldmark v1.8.7 // indirect
	github.com/yuin/goldmark-meta v1.1.0 // indirect
	go.abhg.dev/goldmark/frontmatter v0.2.0 // indirect
	gonum.org/v1/gonum v0.17.0 // indirect
	gopkg.in/yaml.v2 v2.3.0 // indirect
	gopkg.in/yaml.v3 v3.0.1 // indirect
)
