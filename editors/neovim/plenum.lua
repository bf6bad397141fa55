-- Plenum language support for Neovim (0.7 or later): the `*.plenum`
-- filetype and the `plenum lsp` language server.
--
-- Put this file on your runtimepath as `lua/plenum.lua` (or copy its body
-- into your config) and call:
--
--   require("plenum").setup()                      -- runs `plenum lsp`
--   require("plenum").setup({ cmd = { "/path/to/plenum", "lsp" } })
--
-- Hover an air handler (K) for its coil load in tons, see each coil's
-- required capacity and margin as inlay hints, and get diagnostics as you
-- type.

local M = {}

-- The project root: the nearest folder with plenum.toml, else with .git,
-- else the file's own folder (the rule the server itself applies).
local function root_dir(path)
  local dir = vim.fn.fnamemodify(path, ":p:h")
  local toml = vim.fn.findfile("plenum.toml", dir .. ";")
  if toml ~= "" then
    return vim.fn.fnamemodify(toml, ":p:h")
  end
  local git = vim.fn.finddir(".git", dir .. ";")
  if git ~= "" then
    return vim.fn.fnamemodify(git, ":p:h:h")
  end
  return dir
end

-- One client per root; `vim.lsp.start` where it exists (0.8+), else the
-- 0.7 calls it is made of.
local clients = {}
local function start(config, bufnr)
  if vim.lsp.start then
    return vim.lsp.start(config, { bufnr = bufnr })
  end
  local id = clients[config.root_dir]
  if not id or vim.lsp.get_client_by_id(id) == nil then
    id = vim.lsp.start_client(config)
    clients[config.root_dir] = id
  end
  if id then
    vim.lsp.buf_attach_client(bufnr, id)
  end
  return id
end

function M.setup(opts)
  opts = opts or {}
  local cmd = opts.cmd or { "plenum", "lsp" }
  local group = vim.api.nvim_create_augroup("plenum_lsp", { clear = true })
  if vim.filetype and vim.filetype.add then
    vim.filetype.add({ extension = { plenum = "plenum" } })
  end
  -- Neovim 0.7 detects filetypes with filetype.vim, which reads `#`
  -- comments as `conf`: set it after that guess.
  vim.api.nvim_create_autocmd({ "BufRead", "BufNewFile" }, {
    group = group,
    pattern = "*.plenum",
    command = "set filetype=plenum",
  })
  vim.api.nvim_create_autocmd("FileType", {
    group = group,
    pattern = "plenum",
    callback = function(args)
      vim.bo[args.buf].commentstring = "# %s"
      local name = vim.api.nvim_buf_get_name(args.buf)
      local root = root_dir(name)
      start({
        name = "plenum",
        cmd = cmd,
        root_dir = root,
        workspace_folders = { { uri = vim.uri_from_fname(root), name = root } },
        on_attach = function(client, bufnr)
          -- Inlay hints (required capacity and margin, zone airflow): 0.10+.
          if opts.inlay_hints ~= false and vim.lsp.inlay_hint and client.server_capabilities.inlayHintProvider then
            pcall(vim.lsp.inlay_hint.enable, true, { bufnr = bufnr })
          end
          if opts.on_attach then
            opts.on_attach(client, bufnr)
          end
        end,
      }, args.buf)
    end,
  })
end

return M
