import type { Knex } from "knex";

// Purchase orders: one supplier, one delivery kitchen, lines of the supplier's items in packs.
// Life (lib/purchasing/order-status.ts): draft -> approved -> sent -> partly_received -> received,
// or closed_short, or cancelled. Each step keeps who and when (the order page's history).
//
// Numbers: "PO-2026-0001", per company and calendar year (the company's time zone), from a counter
// row that `insert ... on conflict do update ... returning` bumps under its row lock, so two
// orders created at once never share a number (and the unique index would refuse it anyway).
//
// Money: NUMERIC(20,4) in the company's one currency, major units: pack prices as the supplier
// quotes them (up to 4 decimals), line totals = packs x pack price rounded half-even to the
// currency's decimals, the total their sum (lib/purchasing/order-money.ts; the server computes
// them, clients never send totals). Quantities: NUMERIC(30,12) in the item's stock unit.
// pack_size_stock is a snapshot of the supplier item's pack when the line was written (an item
// whose units change converts its supplier items again; an order already made keeps what it
// ordered), as are the supplier's SKU, description and pack label the supplier was sent.
// received_stock is raised by deliveries (a later task), in the same stock unit.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("purchase_order_numbers", (t) => {
    t.uuid("company_id").notNullable().references("companies.id").onDelete("CASCADE");
    t.integer("year").notNullable();
    t.integer("last_no").notNullable();
    t.primary(["company_id", "year"]);
  });

  await knex.schema.createTable("purchase_orders", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    t.uuid("company_id").notNullable().references("companies.id").onDelete("CASCADE");
    t.text("number").notNullable();
    t.uuid("supplier_id").notNullable();
    t.uuid("kitchen_id").notNullable(); // where the goods are delivered
    t.text("status").notNullable().defaultTo("draft");
    t.date("deliver_by"); // asked-for delivery date; null: none asked
    t.text("notes").notNullable().defaultTo("");
    t.decimal("total", 20, 4).notNullable().defaultTo(0);
    t.uuid("created_by").references("app_users.id").onDelete("SET NULL");
    t.uuid("approved_by").references("app_users.id").onDelete("SET NULL");
    t.timestamp("approved_at", { useTz: true });
    t.uuid("sent_by").references("app_users.id").onDelete("SET NULL");
    t.timestamp("sent_at", { useTz: true });
    t.uuid("sent_outbox_email_id").references("outbox_emails.id").onDelete("SET NULL");
    t.uuid("closed_by").references("app_users.id").onDelete("SET NULL");
    t.timestamp("closed_at", { useTz: true });
    t.text("close_reason");
    t.uuid("cancelled_by").references("app_users.id").onDelete("SET NULL");
    t.timestamp("cancelled_at", { useTz: true });
    t.text("cancel_reason");
    t.uuid("cancel_outbox_email_id").references("outbox_emails.id").onDelete("SET NULL");
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp("updated_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.unique(["company_id", "id"]);
    t.unique(["company_id", "number"]);
    t.foreign(["company_id", "supplier_id"]).references(["company_id", "id"]).inTable("suppliers");
    t.foreign(["company_id", "kitchen_id"]).references(["company_id", "id"]).inTable("kitchens");
  });
  await knex.raw(`alter table purchase_orders
    add constraint purchase_orders_status check (status in ('draft','approved','sent','partly_received','received','closed_short','cancelled')),
    add constraint purchase_orders_number check (number ~ '^PO-[0-9]{4}-[0-9]{4,}$'),
    add constraint purchase_orders_total check (total >= 0),
    add constraint purchase_orders_approved check (status in ('draft','cancelled') or approved_at is not null),
    add constraint purchase_orders_sent check (status not in ('sent','partly_received','received','closed_short') or sent_at is not null),
    add constraint purchase_orders_closed check (status <> 'closed_short' or (closed_at is not null and btrim(coalesce(close_reason, '')) <> '')),
    add constraint purchase_orders_cancelled check (status <> 'cancelled' or (cancelled_at is not null and btrim(coalesce(cancel_reason, '')) <> ''))`);
  await knex.raw(`create index purchase_orders_list on purchase_orders (company_id, created_at desc, id desc)`);
  await knex.raw(`create index purchase_orders_status on purchase_orders (company_id, status)`);
  await knex.raw(`create index purchase_orders_supplier on purchase_orders (company_id, supplier_id)`);
  await knex.raw(`create index purchase_orders_kitchen on purchase_orders (company_id, kitchen_id)`);

  await knex.schema.createTable("purchase_order_lines", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    t.uuid("company_id").notNullable();
    t.uuid("order_id").notNullable();
    t.integer("line_no").notNullable();
    t.uuid("supplier_item_id").notNullable();
    t.uuid("item_id").notNullable();
    t.text("supplier_sku").notNullable();
    t.text("description").notNullable();
    t.text("pack_label").notNullable();
    t.decimal("packs", 30, 12).notNullable();
    t.decimal("pack_size_stock", 30, 12).notNullable();
    t.decimal("quantity_stock", 30, 12).notNullable(); // packs x pack_size_stock
    t.decimal("pack_price", 20, 4).notNullable();
    t.decimal("line_total", 20, 4).notNullable();
    t.decimal("received_stock", 30, 12).notNullable().defaultTo(0);
    t.unique(["company_id", "id"]);
    t.unique(["order_id", "line_no"]);
    t.unique(["order_id", "supplier_item_id"]);
    t.foreign(["company_id", "order_id"]).references(["company_id", "id"]).inTable("purchase_orders").onDelete("CASCADE");
    t.foreign(["company_id", "supplier_item_id"]).references(["company_id", "id"]).inTable("supplier_items");
    t.foreign(["company_id", "item_id"]).references(["company_id", "id"]).inTable("items");
  });
  await knex.raw(`alter table purchase_order_lines
    add constraint purchase_order_lines_line_no check (line_no > 0),
    add constraint purchase_order_lines_packs check (packs > 0),
    add constraint purchase_order_lines_pack_size check (pack_size_stock > 0),
    add constraint purchase_order_lines_quantity check (quantity_stock > 0),
    add constraint purchase_order_lines_pack_price check (pack_price >= 0),
    add constraint purchase_order_lines_line_total check (line_total >= 0),
    add constraint purchase_order_lines_received check (received_stock >= 0)`);
  // open quantities per item (the reorder suggestion's "open orders")
  await knex.raw(`create index purchase_order_lines_item on purchase_order_lines (company_id, item_id)`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("purchase_order_lines");
  await knex.schema.dropTable("purchase_orders");
  await knex.schema.dropTable("purchase_order_numbers");
}
