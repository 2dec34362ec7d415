// An ordered list with O(log n) insertion and removal by handle, and O(1) neighbours: the
// sweep-line status of the crossing check. A treap (random priorities keep it balanced on
// average) threaded with a doubly linked list for the neighbours.

export interface OrderNode<T> {
	value: T;
	prev: OrderNode<T> | null;
	next: OrderNode<T> | null;
	left: OrderNode<T> | null;
	right: OrderNode<T> | null;
	parent: OrderNode<T> | null;
	priority: number;
}

/** A deterministic pseudo-random sequence, so runs are repeatable (mulberry32). */
function priorities(seed: number): () => number {
	let a = seed >>> 0;
	return () => {
		a = (a + 0x6d2b79f5) >>> 0;
		let t = a;
		t = Math.imul(t ^ (t >>> 15), t | 1);
		t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
		return (t ^ (t >>> 14)) >>> 0;
	};
}

export class SweepOrder<T> {
	private root: OrderNode<T> | null = null;
	private readonly nextPriority = priorities(0x5eed);

	/** @param below true when `a` goes before `b` in the order */
	constructor(private readonly below: (a: T, b: T) => boolean) {}

	/** Inserts a value where `below` places it and returns its node. */
	insert(value: T): OrderNode<T> {
		const node: OrderNode<T> = { value, prev: null, next: null, left: null, right: null, parent: null, priority: this.nextPriority() };
		if (!this.root) {
			this.root = node;
			return node;
		}
		let at = this.root;
		let pred: OrderNode<T> | null = null;
		let succ: OrderNode<T> | null = null;
		for (;;) {
			if (this.below(value, at.value)) {
				succ = at;
				if (!at.left) { at.left = node; break; }
				at = at.left;
			} else {
				pred = at;
				if (!at.right) { at.right = node; break; }
				at = at.right;
			}
		}
		node.parent = at;
		node.prev = pred;
		node.next = succ;
		if (pred) pred.next = node;
		if (succ) succ.prev = node;
		while (node.parent && node.parent.priority < node.priority) this.rotateUp(node);
		return node;
	}

	/** Removes a node returned by `insert`. */
	remove(node: OrderNode<T>): void {
		while (node.left && node.right) this.rotateUp(node.left.priority > node.right.priority ? node.left : node.right);
		const child = node.left ?? node.right;
		this.replace(node, child);
		if (node.prev) node.prev.next = node.next;
		if (node.next) node.next.prev = node.prev;
		node.prev = node.next = node.parent = node.left = node.right = null;
	}

	private replace(node: OrderNode<T>, child: OrderNode<T> | null): void {
		const parent = node.parent;
		if (child) child.parent = parent;
		if (!parent) this.root = child;
		else if (parent.left === node) parent.left = child;
		else parent.right = child;
	}

	/** Turns `node` above its parent, keeping the in-order sequence. */
	private rotateUp(node: OrderNode<T>): void {
		const parent = node.parent!;
		this.replace(parent, node);
		if (parent.left === node) {
			parent.left = node.right;
			if (node.right) node.right.parent = parent;
			node.right = parent;
		} else {
			parent.right = node.left;
			if (node.left) node.left.parent = parent;
			node.left = parent;
		}
		parent.parent = node;
	}
}
