"""Reference causal ordering from general-purpose libraries, for cross-checks.

stdin:  {"systems": [{"nv": int, "equations": [[var, ...], ...], "exogenous": [var, ...]}]}
stdout: {"results": [{"nx_matching": int, "scipy_matching": int,
                      "blocks": [{"vars": [...], "eqs": [...], "det": "well"|"over"|"under", "level": int}]}]}

Matching: networkx.algorithms.bipartite.hopcroft_karp_matching and
scipy.sparse.csgraph.maximum_bipartite_matching (sizes must agree).
Parts (coarse Dulmage–Mendelsohn) are computed here from the networkx matching by
alternating-path reachability; the well-determined part is oriented by that matching
and split with networkx.strongly_connected_components; levels are longest paths in
the block graph (networkx.topological_sort). Over/under parts are split into the
connected components of their bipartite subgraph (networkx.connected_components).
"""
import json
import sys

import networkx as nx
import numpy as np
from networkx.algorithms import bipartite
from scipy.sparse import csr_matrix
from scipy.sparse.csgraph import maximum_bipartite_matching


def order(system):
    nv = system["nv"]
    eqs = [sorted(set(e)) for e in system["equations"]]
    exo = set(system.get("exogenous", []))
    ne = len(eqs)
    unk = [[v for v in e if v not in exo] for e in eqs]

    g = nx.Graph()
    rows = [("e", r) for r in range(ne)]
    cols = [("v", c) for c in range(nv) if c not in exo]
    g.add_nodes_from(rows, bipartite=0)
    g.add_nodes_from(cols, bipartite=1)
    for r, e in enumerate(unk):
        for c in e:
            g.add_edge(("e", r), ("v", c))
    mate = bipartite.hopcroft_karp_matching(g, top_nodes=rows)
    nx_size = sum(1 for k in mate if k[0] == "e")

    ri = [r for r, e in enumerate(unk) for _ in e]
    ci = [c for e in unk for c in e]
    if ne > 0 and nv > 0:
        a = csr_matrix((np.ones(len(ri), dtype=np.int8), (ri, ci)), shape=(ne, nv))
        sp = maximum_bipartite_matching(a, perm_type="column")
        sp_size = int((sp >= 0).sum())
    else:
        sp_size = 0

    row_mate = {r: mate[("e", r)][1] for r in range(ne) if ("e", r) in mate}
    col_mate = {c: r for r, c in row_mate.items()}
    var_rows = {c: [] for c in range(nv)}
    for r, e in enumerate(unk):
        for c in e:
            var_rows[c].append(r)

    over_r, over_c = set(), set()
    stack = [r for r in range(ne) if r not in row_mate]
    over_r.update(stack)
    while stack:
        r = stack.pop()
        for c in unk[r]:
            if c not in over_c:
                over_c.add(c)
                r2 = col_mate.get(c)
                if r2 is not None and r2 not in over_r:
                    over_r.add(r2)
                    stack.append(r2)
    under_r, under_c = set(), set()
    stack = [c for c in range(nv) if c not in exo and c not in col_mate]
    under_c.update(stack)
    while stack:
        c = stack.pop()
        for r in var_rows[c]:
            if r not in under_r:
                under_r.add(r)
                c2 = row_mate.get(r)
                if c2 is not None and c2 not in under_c:
                    under_c.add(c2)
                    stack.append(c2)
    assert not (over_r & under_r) and not (over_c & under_c)

    blocks = []  # (vars, eqs, det)
    for c in sorted(exo):
        blocks.append(([c], [], "well"))
    for part_r, part_c, det in ((over_r, over_c, "over"), (under_r, under_c, "under")):
        h = nx.Graph()
        h.add_nodes_from(("e", r) for r in part_r)
        h.add_nodes_from(("v", c) for c in part_c)
        for r in part_r:
            for c in unk[r]:
                if c in part_c:
                    h.add_edge(("e", r), ("v", c))
        for comp in nx.connected_components(h):
            blocks.append((sorted(x[1] for x in comp if x[0] == "v"), sorted(x[1] for x in comp if x[0] == "e"), det))
    well_c = [c for c in range(nv) if c not in exo and c not in over_c and c not in under_c]
    d = nx.DiGraph()
    d.add_nodes_from(well_c)
    for r in range(ne):
        if r in over_r or r in under_r:
            continue
        m = row_mate[r]
        for u in unk[r]:
            if u != m and u not in over_c:  # over-determined variables are given to the well part
                d.add_edge(u, m)
    for comp in nx.strongly_connected_components(d):
        vs = sorted(comp)
        blocks.append((vs, sorted(col_mate[v] for v in vs), "well"))

    block_of_var = {}
    for i, (vs, _, _) in enumerate(blocks):
        for v in vs:
            block_of_var[v] = i
    bg = nx.DiGraph()
    bg.add_nodes_from(range(len(blocks)))
    for i, (_, es, _) in enumerate(blocks):
        for r in es:
            for v in eqs[r]:
                p = block_of_var[v]
                if p != i:
                    bg.add_edge(p, i)
    level = {}
    for b in nx.topological_sort(bg):
        level[b] = max((level[p] + 1 for p in bg.predecessors(b)), default=0)
    return {
        "nx_matching": nx_size,
        "scipy_matching": sp_size,
        "blocks": [{"vars": vs, "eqs": es, "det": det, "level": level[i]} for i, (vs, es, det) in enumerate(blocks)],
    }


def main():
    data = json.load(sys.stdin)
    print(json.dumps({"results": [order(s) for s in data["systems"]]}))


if __name__ == "__main__":
    main()
