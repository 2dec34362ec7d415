// Tables that flow across pages, repeating their title and header row on each new page.
import { INK, PAGE, ROW_TINT, SheetWriter, type TextStyle } from './writer';

export interface TableColumn {
	header: string;
	width: number;
	align?: 'left' | 'right' | 'center';
}

export interface TableCell {
	text: string;
	bold?: boolean;
	/** Type size for this cell when it differs from the table's. */
	size?: number;
	/** Drawn in a square at the left of the cell, before the text (crop swatch, tick box). */
	mark?: { size: number; draw: (x: number, y: number) => void };
}

export interface TableOptions {
	title: string;
	size: number;
	headerSize?: number;
	padX?: number;
	padY?: number;
	/** The caller has drawn the heading already; the title is still used on continued pages. */
	noHeading?: boolean;
	/** Let even a short table break after its first rows instead of moving whole to the next page. */
	breakable?: boolean;
	/** Space between wrapped lines of a cell (points); one-line cells of a dense grid need none. */
	lineGap?: number;
}

type Cell = TableCell | string;

const asCell = (cell: Cell): TableCell => (typeof cell === 'string' ? { text: cell } : cell);

/** Draws the table at the writer's cursor and leaves the cursor below it. */
export function drawTable(w: SheetWriter, columns: TableColumn[], rows: Cell[][], options: TableOptions): void {
	const padX = options.padX ?? 4;
	const padY = options.padY ?? 3;
	const bodyStyle: TextStyle = { size: options.size, lineGap: options.lineGap };
	const headerStyle: TextStyle = { size: options.headerSize ?? Math.max(10, options.size - 1), bold: true };
	const total = columns.reduce((sum, c) => sum + c.width, 0);
	const scale = PAGE.contentWidth / total;
	const widths = columns.map((c) => c.width * scale);
	const xs = widths.map((_, i) => PAGE.left + widths.slice(0, i).reduce((s, v) => s + v, 0));

	const textWidth = (i: number, cell: TableCell) => widths[i] - 2 * padX - (cell.mark ? cell.mark.size + 4 : 0);
	const cellHeight = (i: number, cell: TableCell, style: TextStyle) =>
		Math.max(w.measure(cell.text, textWidth(i, cell), { ...style, size: cell.size ?? style.size, bold: cell.bold ?? style.bold }), cell.mark?.size ?? 0);

	const headerHeight =
		Math.max(...columns.map((c, i) => cellHeight(i, { text: c.header }, headerStyle))) + 2 * padY;

	let headerBottom = -1;
	const drawHeader = () => {
		const top = w.y;
		columns.forEach((c, i) => {
			w.write(c.header, xs[i] + padX, top + padY, widths[i] - 2 * padX, { ...headerStyle, align: c.align });
		});
		w.y = top + headerHeight;
		w.doc.lineWidth(1.5).strokeColor(INK).moveTo(PAGE.left, w.y).lineTo(PAGE.right, w.y).stroke();
		w.y += 1;
		headerBottom = w.y;
	};

	const continued = () => {
		w.continuedTitle(options.title);
		drawHeader();
	};

	const rowHeights = rows.map(
		(row) => Math.max(...row.map((cell, i) => cellHeight(i, asCell(cell), bodyStyle))) + 2 * padY
	);

	// a short table is kept whole on one page; a long one only keeps its first row with the header
	const wholeHeight = headerHeight + rowHeights.reduce((sum, h) => sum + h, 0) + 4;
	const keep = wholeHeight <= 200 && !options.breakable ? wholeHeight : headerHeight + (rowHeights[0] ?? 0) + (rowHeights[1] ?? 0) + 4;
	if (options.noHeading) w.ensure(keep);
	else w.heading(options.title, keep);
	drawHeader();
	w.withPageStarter(continued, () => {
		rows.forEach((row, r) => {
			const height = rowHeights[r];
			w.ensure(height);
			const top = w.y;
			if (r % 2 === 1) w.doc.rect(PAGE.left, top, PAGE.contentWidth, height).fill(ROW_TINT);
			// the rule above each row is drawn after its tint, so every rule keeps its full weight
			if (top !== headerBottom) w.doc.lineWidth(0.5).strokeColor(INK).moveTo(PAGE.left, top).lineTo(PAGE.right, top).stroke();
			row.forEach((raw, i) => {
				const cell = asCell(raw);
				let x = xs[i] + padX;
				if (cell.mark) {
					cell.mark.draw(x, top + padY + 1);
					x += cell.mark.size + 4;
				}
				w.write(cell.text, x, top + padY, textWidth(i, cell), {
					...bodyStyle,
					size: cell.size ?? bodyStyle.size,
					bold: cell.bold,
					align: columns[i].align
				});
			});
			w.y = top + height;
		});
	});
	w.doc.lineWidth(0.5).strokeColor(INK).moveTo(PAGE.left, w.y).lineTo(PAGE.right, w.y).stroke();
	w.y += 4;
}
