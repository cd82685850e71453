# Reference for folding: NetworkX's quotient graph of the ordering's edge graph,
# with each folded block as one class (networkx.quotient_graph, NetworkX docs).
import json, sys
import networkx as nx
def quotient(d):
    g = nx.DiGraph()
    g.add_nodes_from(d["nodes"])
    g.add_edges_from([tuple(e) for e in d["edges"]])
    classes = [set(b) for b in d["folded"]]
    covered = set().union(*classes) if classes else set()
    parts = classes + [{n} for n in d["nodes"] if n not in covered]
    q = nx.quotient_graph(g, parts, create_using=nx.DiGraph)
    name = lambda c: ("block:" + "+".join(sorted(c))) if len(c) > 1 or any(c == x for x in classes) else next(iter(c))
    out = sorted({(name(a), name(b)) for a, b in q.edges() if a != b})
    return {"nodes": sorted(name(c) for c in q.nodes()), "edges": out}

d = json.load(sys.stdin)
json.dump([quotient(x) for x in d] if isinstance(d, list) else quotient(d), sys.stdout)
