package main

import (
	"fmt"
	"os"

	"pare/graph"
	"pare/rules"
	"pare/rules/stages"
)

func main() {
	c, err := graph.LoadFile(os.Args[1])
	if err != nil {
		fmt.Println(err)
		return
	}
	r, log, err := rules.Reduce(c, rules.Options{Level: rules.LevelSignal})
	if err != nil {
		fmt.Println(err)
		return
	}
	if len(os.Args) > 2 {
		graph.Write(os.Stdout, r)
	}
	fmt.Println("acground", log.ACGround)
	for _, s := range log.Steps {
		fmt.Println(s.String())
	}
	st, err := stages.Find(r, stages.Options{Full: c, ACGround: log.ACGround})
	for _, s := range st {
		fmt.Printf("%s %s %s %v %v %v\n", s.Name, s.Topology, s.Title, s.Parts, s.Figures, s.Flags)
		fmt.Println("   contains", s.Contains)
	}
	fmt.Println("unmatched", stages.Unmatched(r, st), err)
}
