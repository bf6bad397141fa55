-- End-to-end test: headless Neovim opens an example design with the Plenum
-- language server, receives its diagnostics, hovers an air handler and
-- reads its coil tonnage, then follows an edit. Run by run.sh.
--
-- Environment: PLENUM_LSP_CMD (the server command), PLENUM_EXAMPLE (a
-- design file), PLENUM_NVIM_PLUGIN (editors/neovim/plenum.lua).

local passed, failed = 0, 0
-- Straight to standard output, one line each (`print` in a headless
-- Neovim goes to the message area and may end without a line break).
local function say(line)
  io.stdout:write(line .. "\n")
  io.stdout:flush()
end

local function check(name, ok, detail)
  if ok then
    passed = passed + 1
    say("ok   " .. name)
  else
    failed = failed + 1
    say("FAIL " .. name .. (detail and (": " .. tostring(detail)) or ""))
  end
end

local function finish()
  say(string.format("neovim: %d passed, %d failed", passed, failed))
  if failed == 0 then
    vim.cmd("qall!")
  else
    vim.cmd("cquit!")
  end
end

local ok_run, err = pcall(function()
  local cmd = {}
  for word in assert(os.getenv("PLENUM_LSP_CMD"), "PLENUM_LSP_CMD"):gmatch("%S+") do
    table.insert(cmd, word)
  end
  local example = assert(os.getenv("PLENUM_EXAMPLE"), "PLENUM_EXAMPLE")
  local plenum = dofile(assert(os.getenv("PLENUM_NVIM_PLUGIN"), "PLENUM_NVIM_PLUGIN"))

  -- Record every publishDiagnostics that reaches the client.
  local published = {}
  local default = vim.lsp.handlers["textDocument/publishDiagnostics"]
  vim.lsp.handlers["textDocument/publishDiagnostics"] = function(e, result, ctx, config)
    table.insert(published, result)
    return default(e, result, ctx, config)
  end

  plenum.setup({ cmd = cmd })
  vim.cmd("edit " .. vim.fn.fnameescape(example))
  local buf = vim.api.nvim_get_current_buf()
  check("filetype is plenum", vim.bo[buf].filetype == "plenum", vim.bo[buf].filetype)

  local get_clients = vim.lsp.get_clients or vim.lsp.get_active_clients
  local attached = vim.wait(20000, function() return #get_clients({ bufnr = buf }) > 0 end, 50)
  check("the server attaches", attached)

  local got = vim.wait(20000, function() return #published > 0 end, 50)
  check("diagnostics are published for the example", got and #vim.diagnostic.get(buf) > 0,
    got and ("published, " .. #vim.diagnostic.get(buf) .. " shown") or "none published")

  -- Hover the first air handler's name.
  local lines = vim.api.nvim_buf_get_lines(buf, 0, -1, false)
  local line, col
  for i, l in ipairs(lines) do
    local s = l:find("^ahu ")
    if s then
      line, col = i - 1, 4
      break
    end
  end
  assert(line, "the example has an air handler")
  local params = { textDocument = { uri = vim.uri_from_bufnr(buf) }, position = { line = line, character = col } }
  local responses = vim.lsp.buf_request_sync(buf, "textDocument/hover", params, 20000) or {}
  local text = ""
  for _, r in pairs(responses) do
    if r.result and r.result.contents then
      local c = r.result.contents
      text = text .. (type(c) == "table" and (c.value or "") or tostring(c))
    end
  end
  local tons = text:match("Coil total%*%*: ([%d%.]+ ton)")
  check("the hover shows the coil tonnage", tons ~= nil, text:sub(1, 200))
  if tons then
    say("     hover: coil total " .. tons)
  end
  check("the hover carries the caution", text:find("qualified engineer", 1, true) ~= nil)

  -- An edit: misspell a key; the diagnostics follow.
  for i, l in ipairs(lines) do
    local s, e = l:find("supply_temp")
    if s then
      vim.api.nvim_buf_set_text(buf, i - 1, s - 1, i - 1, e, { "supply_tmp" })
      break
    end
  end
  local function has_unknown_key()
    for _, d in ipairs(vim.diagnostic.get(buf)) do
      local code = d.code or (d.user_data and d.user_data.lsp and d.user_data.lsp.code)
      if code == "unknown-key" then return true end
    end
    return false
  end
  check("an edit is followed by its diagnostic", vim.wait(20000, has_unknown_key, 50))

  for _, c in ipairs(get_clients({ bufnr = buf })) do
    c.stop()
  end
  vim.wait(5000, function() return #get_clients({ bufnr = buf }) == 0 end, 50)
end)

if not ok_run then
  check("the test ran to the end", false, tostring(err))
end
finish()
